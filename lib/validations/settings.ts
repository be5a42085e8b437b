import { z } from "zod";

import { ROLES } from "@/lib/domain/roles";

const n = (label: string, min: number, max: number) =>
  z.coerce
    .number({ error: `${label} must be a number` })
    .min(min, `${label} must be between ${min} and ${max}`)
    .max(max, `${label} must be between ${min} and ${max}`);

/** Shop defaults as the settings form sends them (BSFC in g/kWh, pressure in kPa). */
export const ShopSettingsSchema = z
  .object({
    shopName: z.string().trim().min(2, "Enter the shop's name").max(120),
    currency: z
      .string()
      .trim()
      .toUpperCase()
      .regex(/^[A-Z]{3}$/, "Use a three-letter currency code such as USD"),
    taxRatePct: n("Tax rate", 0, 30),
    units: z.enum(["metric", "imperial"], { error: "Choose metric or imperial" }),
    address: z.string().trim().max(300).optional(),
    phone: z.string().trim().max(40).optional(),
    bsfcGasolineNa: n("BSFC gasoline NA", 150, 1200),
    bsfcGasolineBoosted: n("BSFC gasoline boosted", 150, 1200),
    bsfcE85Na: n("BSFC E85 NA", 150, 1200),
    bsfcE85Boosted: n("BSFC E85 boosted", 150, 1200),
    designDutyPct: n("Design duty", 50, 95),
    dutyCautionPct: n("Caution duty", 50, 100),
    dutyDangerPct: n("Danger duty", 50, 100),
    minPumpMarginPct: n("Minimum pump margin", 0, 200),
    maxLineDropKpa: n("Line drop limit", 1, 100),
    lossManualPct: n("Manual drivetrain loss", 0, 50),
    lossAutomaticPct: n("Automatic drivetrain loss", 0, 50),
    lossAwdPct: n("AWD drivetrain loss", 0, 50),
    labourRate: n("Labour rate", 0, 100_000),
    depositPct: n("Deposit", 0, 100),
    quoteValidDays: n("Quote validity", 1, 365).pipe(
      z.number().int("Quote validity is a whole number of days"),
    ),
  })
  .refine((s) => s.dutyCautionPct <= s.dutyDangerPct, {
    path: ["dutyDangerPct"],
    message: "Danger duty must not be below caution duty",
  });

export const InviteSchema = z.object({
  email: z.string().trim().toLowerCase().pipe(z.email("Enter a valid e-mail address")),
  role: z.enum(ROLES, { error: "Choose a role" }),
});

export const MemberRoleSchema = z.object({
  memberId: z.string().min(1),
  role: z.enum(ROLES, { error: "Choose a role" }),
});
export const MemberRemoveSchema = z.object({ memberId: z.string().min(1) });

/** A person's own display and entry units. */
export const UnitsSchema = z.object({
  units: z.enum(["metric", "imperial"], { error: "Units must be metric or imperial" }),
});
