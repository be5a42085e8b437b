"use server";

import { memberAction } from "@/lib/actions/member-action";
import { createShareLink, revokeShareLink } from "@/lib/shares/share-commands";
import { ShareLinkCreateSchema, ShareLinkRevokeSchema } from "@/lib/validations/shares";

// The list of links is read through the API (SWR), which the caller refreshes; no page to revalidate.

/** A new link to a build's spec sheet: `data` carries `{ link, url }`, the URL shown this once. */
export const createShareLinkAction = memberAction(ShareLinkCreateSchema, (m, input) =>
  createShareLink(m, input),
);

/** Withdraws a link at once. */
export const revokeShareLinkAction = memberAction(ShareLinkRevokeSchema, (m, input) =>
  revokeShareLink(m, input),
);
