import { z } from "zod";

import { parseNumberText } from "@/lib/calc/number-text";
import { converter, formatValue, type Quantity } from "@/lib/calc/quantities";
import { TuneLimitsOverrideSchema } from "@/lib/calc/tune";
import type { UnitSystem } from "@/lib/calc/units";
import { isCountryCode } from "@/lib/domain/countries";
import { canonicalTimeZone, PAPER_SIZES } from "@/lib/domain/documents";
import { ROLES } from "@/lib/domain/roles";

/** A number from a form field (text) or a JSON body (number); a blank field is no number. */
const asNumber = (v: unknown) =>
  typeof v === "string" && v.trim() !== "" ? parseNumberText(v) : v;

const n = (label: string, min: number, max: number, unit = "", whole = "") =>
  z.preprocess(
    asNumber,
    (whole
      ? z.number({ error: `${label} must be a number` }).int(whole)
      : z.number({ error: `${label} must be a number` })
    )
      .min(min, `${label} must be between ${min} and ${max}${unit && ` ${unit}`}`)
      .max(max, `${label} must be between ${min} and ${max}${unit && ` ${unit}`}`),
  );

/** A setting that may be left to the library: blank (or null) clears it, left out keeps it. */
const nOrLibrary = (label: string, min: number, max: number, unit = "") =>
  z.preprocess(
    (v) => (v === "" || (typeof v === "string" && v.trim() === "") ? null : asNumber(v)),
    z
      .number({ error: `${label} must be a number, or blank for the library's value` })
      .min(min, `${label} must be between ${min} and ${max}${unit && ` ${unit}`}`)
      .max(max, `${label} must be between ${min} and ${max}${unit && ` ${unit}`}`)
      .nullable()
      .optional(),
  );

/**
 * Every shop setting, by the name the settings form and `/api/v1/shop/settings` use (BSFC in
 * g/kWh, pressure in kPa, money in major units, rates in %). The form sends all of them; the API
 * any of them (ShopSettingsPatchSchema).
 */
export const ShopSettingsFields = z.object({
  shopName: z.string().trim().min(2, "Enter the shop's name").max(120),
  currency: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{3}$/, "Use a three-letter currency code such as USD"),
  taxRatePct: n("Tax rate", 0, 30, "%"),
  units: z.enum(["metric", "imperial"], { error: "Choose metric or imperial" }),
  /** ISO 3166-1 alpha-2: customers' phone numbers are read as from here; left out: kept. */
  country: z
    .string()
    .trim()
    .toUpperCase()
    .refine(isCountryCode, "Choose the shop's country")
    .optional(),
  address: z.string().trim().max(300).optional(),
  phone: z.string().trim().max(40).optional(),
  paperSize: z.enum(PAPER_SIZES, { error: "Choose Letter or A4 paper" }),
  timeZone: z
    .string({ error: "Give the shop's time zone" })
    .trim()
    .transform((v, ctx) => {
      const zone = canonicalTimeZone(v);
      if (zone) return zone;
      ctx.addIssue({
        code: "custom",
        message: "Use a time zone name such as America/Chicago, Europe/Berlin or UTC",
      });
      return z.NEVER;
    }),
  bsfcGasolineNa: n("BSFC gasoline NA", 150, 1200, "g/kWh"),
  bsfcGasolineBoosted: n("BSFC gasoline boosted", 150, 1200, "g/kWh"),
  bsfcE85Na: n("BSFC E85 NA", 150, 1200, "g/kWh"),
  bsfcE85Boosted: n("BSFC E85 boosted", 150, 1200, "g/kWh"),
  designDutyPct: n("Design duty", 50, 95, "%"),
  dutyCautionPct: n("Caution duty", 50, 100, "%"),
  dutyDangerPct: n("Danger duty", 50, 100, "%"),
  minPumpMarginPct: n("Minimum pump margin", 0, 200, "%"),
  maxLineDropKpa: n("Line drop limit", 1, 100, "kPa"),
  lossManualPct: n("Manual drivetrain loss", 0, 50, "%"),
  lossAutomaticPct: n("Automatic drivetrain loss", 0, 50, "%"),
  lossAwdPct: n("AWD drivetrain loss", 0, 50, "%"),
  // The same ranges as a build's own fuel properties (lib/calc/schema.ts#FuelPropertiesSchema).
  gasolineDensityKgPerL: nOrLibrary("Gasoline density", 0.68, 0.8, "kg/L"),
  gasolineStoichAfr: nOrLibrary("Gasoline stoichiometric AFR", 13, 15.5),
  ethanolDensityKgPerL: nOrLibrary("Ethanol density", 0.75, 0.83, "kg/L"),
  ethanolStoichAfr: nOrLibrary("Ethanol stoichiometric AFR", 8, 10),
  labourRate: n("Labour rate", 0, 100_000),
  depositPct: n("Deposit", 0, 100, "%"),
  quoteValidDays: n("Quote validity", 1, 365, "", "Quote validity is a whole number of days"),
});

export const DUTY_ORDER_MESSAGE = "Danger duty must not be below caution duty";
/** Injectors sized to a design duty above the caution level would always be flagged. */
export const DESIGN_ORDER_MESSAGE =
  "Design duty must not be above caution duty (injectors sized to it would always show a caution)";

/**
 * The settings a person reads and types in their own units (the rest are %, days, money or
 * AFR, the same in both systems), with the quantity that shows them and the canonical bounds.
 */
export const SHOWN_SETTINGS = {
  bsfcGasolineNa: { quantity: "bsfc", label: "BSFC gasoline NA", min: 150, max: 1200 },
  bsfcGasolineBoosted: { quantity: "bsfc", label: "BSFC gasoline boosted", min: 150, max: 1200 },
  bsfcE85Na: { quantity: "bsfc", label: "BSFC E85 NA", min: 150, max: 1200 },
  bsfcE85Boosted: { quantity: "bsfc", label: "BSFC E85 boosted", min: 150, max: 1200 },
  maxLineDropKpa: { quantity: "pressureDrop", label: "Line drop limit", min: 1, max: 100 },
  gasolineDensityKgPerL: {
    quantity: "density",
    label: "Gasoline density",
    min: 0.68,
    max: 0.8,
    library: true,
  },
  ethanolDensityKgPerL: {
    quantity: "density",
    label: "Ethanol density",
    min: 0.75,
    max: 0.83,
    library: true,
  },
} as const satisfies Record<
  string,
  { quantity: Quantity; label: string; min: number; max: number; library?: boolean }
>;
export type ShownSetting = keyof typeof SHOWN_SETTINGS;

/**
 * A canonical bound as a form in `system` states it: rounded to the quantity's precision,
 * inwards, so every number inside the stated bounds converts to one inside the canonical ones.
 */
function shownBound(q: Quantity, canonical: number, system: UnitSystem, side: "min" | "max") {
  const c = converter(q, system);
  const k = 10 ** c.decimals;
  const x = c.to(canonical) * k;
  const r = Math.round(x);
  // A bound that converts to a round number stays it (150 g/kWh in metric is 150).
  return (Math.abs(x - r) < 1e-6 ? r : side === "min" ? Math.ceil(x) : Math.floor(x)) / k;
}

/** The bounds of a shown setting in `system`, and the message that states them with the unit. */
export function shownSettingBounds(name: ShownSetting, system: UnitSystem) {
  const s = SHOWN_SETTINGS[name];
  const min = shownBound(s.quantity, s.min, system, "min");
  const max = shownBound(s.quantity, s.max, system, "max");
  const c = converter(s.quantity, system);
  const say = (x: number) => formatValue(s.quantity, c.from(x), system);
  return { min, max, message: `${s.label} must be between ${say(min)} and ${say(max)}` };
}

const shownSetting = (name: ShownSetting, system: UnitSystem) => {
  const { min, max, message } = shownSettingBounds(name, system);
  const s = SHOWN_SETTINGS[name];
  const num = z.number({
    error: `${s.label} must be a number${"library" in s ? ", or blank for the library's value" : ""}`,
  });
  return "library" in s
    ? z.preprocess(
        (v) => (typeof v === "string" && v.trim() === "" ? null : asNumber(v)),
        num.min(min, message).max(max, message).nullable().optional(),
      )
    : z.preprocess(asNumber, num.min(min, message).max(max, message));
};

const SYSTEMS = ["metric", "imperial"] as const satisfies readonly UnitSystem[];

/** The form's fields in each system, with the rule across fields (caution not above danger). */
const FORM_SCHEMAS = Object.fromEntries(
  SYSTEMS.map((system) => [
    system,
    ShopSettingsFields.extend(
      Object.fromEntries(
        Object.keys(SHOWN_SETTINGS).map((k) => [k, shownSetting(k as ShownSetting, system)]),
      ) as { [K in ShownSetting]: ReturnType<typeof shownSetting> },
    ).refine((s) => s.dutyCautionPct <= s.dutyDangerPct, {
      path: ["dutyDangerPct"],
      message: DUTY_ORDER_MESSAGE,
      // Said beside the other fields' errors, not only once they are right (as ShopSettingsSchema).
      when: (p) => {
        const v = p.value as { dutyCautionPct?: unknown; dutyDangerPct?: unknown };
        return typeof v.dutyCautionPct === "number" && typeof v.dutyDangerPct === "number";
      },
    }),
  ]),
);

/**
 * The settings form: every field, the BSFC, line-drop and density fields typed in the units
 * named by `shownUnits` (the viewer's, when the page was drawn; left out: metric, i.e.
 * canonical) and checked against the bounds in those units. The values stay as typed: the
 * action turns them into canonical ones with `settingsFromShown`, which keeps a stored value
 * the person left as shown.
 */
export const ShopSettingsFormSchema = z
  .looseObject({ shownUnits: z.enum(SYSTEMS).catch("metric") })
  .transform((raw, ctx) => {
    const system = raw.shownUnits as UnitSystem;
    // Every bad field by name, the rule across fields included (a form names them all at once).
    const r = FORM_SCHEMAS[system]!.safeParse(raw);
    if (!r.success) {
      for (const i of r.error.issues)
        ctx.addIssue({ code: "custom", path: i.path, message: i.message });
      return z.NEVER;
    }
    return { ...(r.data as z.output<typeof ShopSettingsFields>), shownUnits: system };
  });
export type ShopSettingsFormInput = z.output<typeof ShopSettingsFormSchema>;

/** Shop defaults as the settings form sends them: every field. */
export const ShopSettingsSchema = ShopSettingsFields.refine(
  (s) => s.dutyCautionPct <= s.dutyDangerPct,
  { path: ["dutyDangerPct"], message: DUTY_ORDER_MESSAGE },
);

/**
 * A change through the API: any of the settings by the form's names, the others kept; a name
 * that is no setting is a field error. `tuneLimits` are the shop's default tune limits: any of
 * their fields over those in force, null back to the library's. Rules across fields (caution
 * below danger) are checked by the command on the settings as they will be.
 */
export const ShopSettingsPatchSchema = ShopSettingsFields.partial()
  .extend({ tuneLimits: TuneLimitsOverrideSchema.nullable().optional() })
  .loose()
  .superRefine(
    (v, ctx) => {
      for (const k of Object.keys(v))
        if (!Object.hasOwn(ShopSettingsFields.shape, k) && k !== "tuneLimits")
          ctx.addIssue({ code: "custom", path: [k], message: `${k} is not a shop setting` });
    },
    // Named beside the other fields' errors, not only once they are right.
    {
      when: (p) => typeof p.value === "object" && p.value !== null && !Array.isArray(p.value),
    },
  );

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
