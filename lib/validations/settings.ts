import { z } from "zod";

import { parseNumberText } from "@/lib/calc/number-text";
import { converter, formatValue, type Quantity } from "@/lib/calc/quantities";
import { TuneLimitsOverrideSchema } from "@/lib/calc/tune";
import type { UnitSystem } from "@/lib/calc/units";
import { isCountryCode } from "@/lib/domain/countries";
import { PAPER_SIZES } from "@/lib/domain/documents";
import { ROLES } from "@/lib/domain/roles";
import { settingName, type SettingName } from "@/lib/domain/shop-settings";
import { canonicalTimeZone, timeZoneMessage } from "@/lib/domain/time-zones";

/**
 * How a number field is read: the form's text fields as typed ("7,000", "0,75"); the JSON API
 * takes JSON numbers only ("72" as a string is refused on its field, not read as 72).
 */
type Read = "text" | "json";

/** A number from a form field (text); a blank field is no number. A JSON body's value as it is. */
const asNumber = (read: Read) => (v: unknown) =>
  read === "text" && typeof v === "string" && v.trim() !== "" ? parseNumberText(v) : v;

/** "must be a number", or in JSON where text was sent, that it must be a JSON number. */
const numberError =
  (read: Read, said: string, tail = "") =>
  (iss: { input?: unknown }) =>
    read === "json" && typeof iss.input === "string"
      ? `${said} must be a JSON number, not text${tail && ` (${tail.replace(/^, /, "")})`}`
      : `${said} must be a number${tail}`;

const between = (said: string, min: number, max: number, unit: string) =>
  `${said} must be between ${min} and ${max}${unit && ` ${unit}`}`;

const n = (read: Read, name: SettingName, min: number, max: number, unit = "", whole = "") => {
  const said = settingName(name);
  const num = z.number({ error: numberError(read, said) });
  return z.preprocess(
    asNumber(read),
    (whole ? num.int(whole) : num)
      .min(min, between(said, min, max, unit))
      .max(max, between(said, min, max, unit)),
  );
};

/** A setting that may be left to the library: blank (or null) clears it, left out keeps it. */
const nOrLibrary = (read: Read, name: SettingName, min: number, max: number, unit = "") => {
  const said = settingName(name);
  return z.preprocess(
    (v) => (read === "text" && typeof v === "string" && v.trim() === "" ? null : asNumber(read)(v)),
    z
      .number({
        error: numberError(
          read,
          said,
          read === "json"
            ? ", or null for the library's value"
            : ", or blank for the library's value",
        ),
      })
      .min(min, between(said, min, max, unit))
      .max(max, between(said, min, max, unit))
      .nullable()
      .optional(),
  );
};

/**
 * Every shop setting, by the name the settings form and `/api/v1/shop/settings` use (BSFC in
 * g/kWh, pressure in kPa, money in major units, rates in %), named in messages as the form labels
 * it (`lib/domain/shop-settings.ts`). The form sends all of them; the API any of them
 * (ShopSettingsPatchSchema), its numbers as JSON numbers.
 */
const settingsFields = (read: Read) =>
  z.object({
    shopName: z.string().trim().min(2, "Enter the shop's name").max(120),
    currency: z
      .string()
      .trim()
      .toUpperCase()
      .regex(/^[A-Z]{3}$/, "Use a three-letter currency code such as USD"),
    taxRatePct: n(read, "taxRatePct", 0, 30, "%"),
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
    /** A zone of the tz database's list (Area/Location) or UTC: no abbreviations, no old names. */
    timeZone: z
      .string({ error: "Give the shop's time zone" })
      .trim()
      .transform((v, ctx) => {
        const zone = canonicalTimeZone(v);
        if (zone) return zone;
        ctx.addIssue({ code: "custom", message: timeZoneMessage(v) });
        return z.NEVER;
      }),
    bsfcGasolineNa: n(read, "bsfcGasolineNa", 150, 1200, "g/kWh"),
    bsfcGasolineBoosted: n(read, "bsfcGasolineBoosted", 150, 1200, "g/kWh"),
    bsfcE85Na: n(read, "bsfcE85Na", 150, 1200, "g/kWh"),
    bsfcE85Boosted: n(read, "bsfcE85Boosted", 150, 1200, "g/kWh"),
    designDutyPct: n(read, "designDutyPct", 50, 95, "%"),
    dutyCautionPct: n(read, "dutyCautionPct", 50, 100, "%"),
    dutyDangerPct: n(read, "dutyDangerPct", 50, 100, "%"),
    minPumpMarginPct: n(read, "minPumpMarginPct", 0, 200, "%"),
    maxLineDropKpa: n(read, "maxLineDropKpa", 1, 100, "kPa"),
    lossManualPct: n(read, "lossManualPct", 0, 50, "%"),
    lossAutomaticPct: n(read, "lossAutomaticPct", 0, 50, "%"),
    lossAwdPct: n(read, "lossAwdPct", 0, 50, "%"),
    // The same ranges as a build's own fuel properties (lib/calc/schema.ts#FuelPropertiesSchema).
    gasolineDensityKgPerL: nOrLibrary(read, "gasolineDensityKgPerL", 0.68, 0.8, "kg/L"),
    gasolineStoichAfr: nOrLibrary(read, "gasolineStoichAfr", 13, 15.5),
    ethanolDensityKgPerL: nOrLibrary(read, "ethanolDensityKgPerL", 0.75, 0.83, "kg/L"),
    ethanolStoichAfr: nOrLibrary(read, "ethanolStoichAfr", 8, 10),
    labourRate: n(read, "labourRate", 0, 100_000),
    depositPct: n(read, "depositPct", 0, 100, "%"),
    quoteValidDays: n(
      read,
      "quoteValidDays",
      1,
      365,
      "days",
      `${settingName("quoteValidDays")} is a whole number of days`,
    ),
  });

/** The settings as the form's text fields give them. */
export const ShopSettingsFields = settingsFields("text");
/** The settings as a JSON body gives them: numbers as JSON numbers. */
const ShopSettingsJsonFields = settingsFields("json");

const CAUTION = settingName("dutyCautionPct");
const DANGER = settingName("dutyDangerPct");
export const DUTY_ORDER_MESSAGE = `${CAUTION} must not be higher than ${DANGER}`;
/** Injectors sized to a design duty above the caution level would always be flagged. */
export const DESIGN_ORDER_MESSAGE = `${settingName("designDutyPct")} must not be higher than ${CAUTION} (injectors sized to it would always show a caution)`;

/**
 * A caution level above the danger level, said on the field the person changed: the one sent
 * (the API) or changed from what the form loaded. Both: the caution level, and the message says
 * why — it is the level the bands start from, so it is the one to bring down.
 */
export function dutyOrderIssue(
  changed: { caution: boolean; danger: boolean },
  caution: number,
  danger: number,
): { path: "dutyCautionPct" | "dutyDangerPct"; message: string } {
  const c = `${CAUTION} (${caution} %)`;
  const d = `${DANGER} (${danger} %)`;
  if (changed.danger && !changed.caution)
    return { path: "dutyDangerPct", message: `${d} must not be lower than ${c}` };
  if (changed.caution && changed.danger)
    return {
      path: "dutyCautionPct",
      message: `${c} must not be higher than ${d}; both were changed, so the caution level is marked: the duty bands start from it`,
    };
  return { path: "dutyCautionPct", message: `${c} must not be higher than ${d}` };
}

/**
 * The settings a person reads and types in their own units (the rest are %, days, money or
 * AFR, the same in both systems), with the quantity that shows them and the canonical bounds.
 */
export const SHOWN_SETTINGS = {
  bsfcGasolineNa: { quantity: "bsfc", label: settingName("bsfcGasolineNa"), min: 150, max: 1200 },
  bsfcGasolineBoosted: {
    quantity: "bsfc",
    label: settingName("bsfcGasolineBoosted"),
    min: 150,
    max: 1200,
  },
  bsfcE85Na: { quantity: "bsfc", label: settingName("bsfcE85Na"), min: 150, max: 1200 },
  bsfcE85Boosted: { quantity: "bsfc", label: settingName("bsfcE85Boosted"), min: 150, max: 1200 },
  maxLineDropKpa: {
    quantity: "pressureDrop",
    label: settingName("maxLineDropKpa"),
    min: 1,
    max: 100,
  },
  gasolineDensityKgPerL: {
    quantity: "density",
    label: settingName("gasolineDensityKgPerL"),
    min: 0.68,
    max: 0.8,
    library: true,
  },
  ethanolDensityKgPerL: {
    quantity: "density",
    label: settingName("ethanolDensityKgPerL"),
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
        (v) => (typeof v === "string" && v.trim() === "" ? null : asNumber("text")(v)),
        num.min(min, message).max(max, message).nullable().optional(),
      )
    : z.preprocess(asNumber("text"), num.min(min, message).max(max, message));
};

const SYSTEMS = ["metric", "imperial"] as const satisfies readonly UnitSystem[];

/** The form's fields in each system. */
const FORM_SCHEMAS = Object.fromEntries(
  SYSTEMS.map((system) => [
    system,
    ShopSettingsFields.extend(
      Object.fromEntries(
        Object.keys(SHOWN_SETTINGS).map((k) => [k, shownSetting(k as ShownSetting, system)]),
      ) as { [K in ShownSetting]: ReturnType<typeof shownSetting> },
    ),
  ]),
);

/** A form field's number as typed, or null (blank, not a number). */
const typed = (v: unknown): number | null => {
  const x = typeof v === "string" && v.trim() !== "" ? parseNumberText(v) : v;
  return typeof x === "number" && Number.isFinite(x) ? x : null;
};

/**
 * The rule across fields on the form, beside the other fields' errors: a caution level above the
 * danger level, on the field the person changed from what the page loaded (`loaded…` hidden
 * fields; without them, as if both were changed).
 */
function formDutyOrder(raw: Record<string, unknown>) {
  const caution = typed(raw.dutyCautionPct);
  const danger = typed(raw.dutyDangerPct);
  if (caution === null || danger === null || caution <= danger) return null;
  const changed = (now: number, loaded: unknown) => typed(loaded) !== now;
  return dutyOrderIssue(
    {
      caution: changed(caution, raw.loadedDutyCautionPct),
      danger: changed(danger, raw.loadedDutyDangerPct),
    },
    caution,
    danger,
  );
}

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
    const order = formDutyOrder(raw);
    if (!r.success || order) {
      for (const i of r.error?.issues ?? [])
        ctx.addIssue({ code: "custom", path: i.path, message: i.message });
      if (order) ctx.addIssue({ code: "custom", path: [order.path], message: order.message });
      return z.NEVER;
    }
    return { ...(r.data as z.output<typeof ShopSettingsFields>), shownUnits: system };
  });
export type ShopSettingsFormInput = z.output<typeof ShopSettingsFormSchema>;

/** Shop defaults as the settings form sends them: every field. */
export const ShopSettingsSchema = ShopSettingsFields.refine(
  (s) => s.dutyCautionPct <= s.dutyDangerPct,
  { path: ["dutyCautionPct"], message: DUTY_ORDER_MESSAGE },
);

/**
 * A change through the API: any of the settings by the form's names, the others kept; a name
 * that is no setting is a field error; numbers are JSON numbers ("72" is refused on its field). `tuneLimits` are the shop's default tune limits: any of
 * their fields over those in force, null back to the library's. Rules across fields (caution
 * below danger) are checked by the command on the settings as they will be.
 */
export const ShopSettingsPatchSchema = ShopSettingsJsonFields.partial()
  .extend({ tuneLimits: TuneLimitsOverrideSchema.nullable().optional() })
  .loose()
  .superRefine(
    (v, ctx) => {
      for (const k of Object.keys(v))
        if (!Object.hasOwn(ShopSettingsJsonFields.shape, k) && k !== "tuneLimits")
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
