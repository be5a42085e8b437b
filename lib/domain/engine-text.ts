/**
 * What a caller's engine text ("4.4 twin-turbo V8", "2.0L inline-four turbo", "5700cc V8")
 * says about the engine: displacement, cylinders and aspiration, each only where the text
 * names it. The counter's goal form prefills its fields with it (editable).
 */
export interface EngineGuess {
  displacementL?: number;
  cylinders?: number;
  aspiration?: "na" | "turbo" | "supercharged";
}

const WORDS: Record<string, number> = {
  two: 2,
  three: 3,
  four: 4,
  five: 5,
  six: 6,
  eight: 8,
  ten: 10,
  twelve: 12,
};
const count = (s: string) => WORDS[s.toLowerCase()] ?? Number(s);

/**
 * @example engineFromText("4.4 twin-turbo V8") // { displacementL: 4.4, cylinders: 8, aspiration: "turbo" }
 * @example engineFromText("2.0L inline-four") // { displacementL: 2, cylinders: 4 }
 */
export function engineFromText(text: string | null | undefined): EngineGuess {
  const t = (text ?? "").trim();
  const out: EngineGuess = {};
  if (!t) return out;
  const cc = /\b(\d{3,4})\s*cc\b/i.exec(t);
  const litres = /(?:^|[^\d.])(\d{1,2}(?:[.,]\d{1,2})?)\s*(?:l|litres?|liters?)\b/i.exec(t);
  const decimal = /(?:^|[^\d.])(\d{1,2}[.,]\d{1,2})(?![\d.,])/.exec(t);
  const raw = cc
    ? Number(cc[1]) / 1000
    : litres
      ? Number(litres[1]!.replace(",", "."))
      : decimal
        ? Number(decimal[1]!.replace(",", "."))
        : undefined;
  if (raw !== undefined && raw >= 0.3 && raw <= 15) out.displacementL = Math.round(raw * 100) / 100;
  const n = "(\\d{1,2}|two|three|four|five|six|eight|ten|twelve)";
  const cyl =
    /\b[VWH][- ]?(\d{1,2})\b/i.exec(t) ??
    new RegExp(`\\b(?:inline|straight|flat|boxer)[- ]?${n}\\b`, "i").exec(t) ??
    /\b[IL](\d)\b/.exec(t) ??
    new RegExp(`\\b${n}[- ]?(?:cyl(?:inders?)?|cylinder)\\b`, "i").exec(t);
  if (cyl) {
    const c = count(cyl[1]!);
    if (Number.isInteger(c) && c >= 1 && c <= 16) out.cylinders = c;
  }
  if (/super[- ]?charg|blower|\bblown\b/i.test(t)) out.aspiration = "supercharged";
  else if (/turbo|\bbi[- ]?turbo/i.test(t)) out.aspiration = "turbo";
  else if (/naturally aspirated|\bN\/?A\b/i.test(t)) out.aspiration = "na";
  return out;
}
