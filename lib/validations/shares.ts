import { z } from "zod";

/** How long a new share link works (the API's body). */
export const ShareLinkDaysSchema = z.object({
  days: z
    .number({ error: "days must be a number" })
    .int("days must be a whole number")
    .min(1, "A link lasts at least 1 day")
    .max(90, "A link lasts at most 90 days")
    .default(14),
});

/** A new link to a build's spec sheet. */
export const ShareLinkCreateSchema = ShareLinkDaysSchema.extend({
  buildId: z.uuid({ error: "That build was not found" }),
});
export type ShareLinkCreate = z.output<typeof ShareLinkCreateSchema>;

/** Withdrawing a link. */
export const ShareLinkRevokeSchema = z.object({
  id: z.uuid({ error: "That link was not found" }),
});
export type ShareLinkRevoke = z.output<typeof ShareLinkRevokeSchema>;
