import {
  CalcInputError,
  fillTemplate,
  flexSensorAdvice,
  PRE_PUMP_FILTER_CAUTION_KPA,
  REGULATOR_LABELS,
  sizeParsedFuelSystem,
  type Figure,
  type FigureParams,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
  type UnitSystem,
} from "@/lib/calc";
import { type KitRole } from "@/lib/domain/builds";
import { type PartCategory } from "@/lib/domain/parts";

export { fitLabel, fitLabels } from "./fit-labels";

/** A catalog part as the recommender needs it. */
export interface CatalogPart {
  id: string;
  sku: string;
  brand: string;
  name: string;
  category: PartCategory;
  priceMinor: number;
  stock: number;
  /**
   * Held by accepted quotes — for a build's kit, less what this build's own quotes hold, so the
   * ranking does not move when the chosen parts are quoted and accepted.
   */
  reserved: number;
  /** When units not on the shelf are expected ("YYYY-MM-DD"); null or absent: not known. */
  expectedOn?: string | null;
  specs: Record<string, unknown>;
}

export interface Candidate {
  role: KitRole;
  part: CatalogPart;
  quantity: number;
  fits: boolean;
  /** Lower is better: fit first, then price, then stock. */
  score: number;
  /** Why it fits or not: templates with their figures, read with `reasonText` in the reader's units. */
  why: Reason[];
  /** The figure the part was judged on (duty %, margin %, drop kPa). */
  figure: number | null;
  /** Free units against the units the candidate needs, and when the missing ones are expected. */
  stock: { free: number; needed: number; expectedOn: string | null };
}

/** A candidate before its stock facts are attached. */
type Draft = Omit<Candidate, "stock">;

export interface Recommendation {
  roles: { role: KitRole; label: string; needed: boolean; candidates: Candidate[] }[];
}

/** One reason of a verdict: a template whose `{name}` places are figures (lib/calc quantities). */
export interface Reason {
  text: string;
  params?: FigureParams;
}
/** A reason as a person reads it, in their unit system. */
export const reasonText = (r: Reason, units: UnitSystem): string =>
  fillTemplate(r.text, r.params, units);
/** A filter this fine or coarser is a pre-pump strainer (common practice, no source). */
export const STRAINER_MICRON = 30;
const R = (text: string, params?: FigureParams): Reason => (params ? { text, params } : { text });
const pct = (value: number): Figure => ({ value, quantity: "percent", decimals: 0 });
const E = (value: number): Figure => ({ value, quantity: "ethanol" });
const count = (value: number): Figure => ({ value, quantity: "count" });

/**
 * Sizes the build with one candidate's data; a part whose catalog data the library refuses (a
 * pump without a usable flow curve, say) gives null, so one bad record cannot break every kit.
 */
function sizeWith(input: ParsedFuelSystemInput): FuelSystemResult | null {
  try {
    return sizeParsedFuelSystem(input);
  } catch (e) {
    if (e instanceof CalcInputError) return null;
    throw e;
  }
}
/** A candidate the kit could not check: listed last, never a fit. */
function unchecked(role: KitRole, part: CatalogPart, quantity: number): Draft {
  return {
    role,
    part,
    quantity,
    fits: false,
    score: 10_000 + tieBreak(part, quantity),
    why: [R("cannot be checked: its catalog data is incomplete (see the part's specs)")],
    figure: null,
  };
}

const available = (p: CatalogPart) => p.stock - p.reserved;
const stockNote = (p: CatalogPart, qty: number): Reason =>
  available(p) >= qty
    ? R("{n} in stock", { n: count(available(p)) })
    : available(p) > 0
      ? R("only {n} in stock (needs {qty})", { n: count(available(p)), qty: count(qty) })
      : R("not in stock");
/** Price and stock break ties between parts that fit equally well. */
const tieBreak = (p: CatalogPart, qty: number) =>
  (p.priceMinor * qty) / 1e7 + (available(p) >= qty ? 0 : 0.5);

/** Gasoline blends above E15 need parts rated for ethanol (common practice, no source). */
const needsEthanolRating = (input: ParsedFuelSystemInput) => input.fuel.ethanolMaxVolPct > 15;

function withInjector(input: ParsedFuelSystemInput, p: CatalogPart): ParsedFuelSystemInput {
  const s = p.specs as {
    ratedFlowCcPerMin: number;
    ratedPressureKpa: number;
    minPulseWidthMs?: number;
    ratingFluidDensityKgPerL?: number;
    deadTime?: ParsedFuelSystemInput["injectors"]["deadTime"];
  };
  return {
    ...input,
    injectors: {
      count: input.injectors.count,
      ratedFlowCcPerMin: s.ratedFlowCcPerMin,
      ratedPressureKpa: s.ratedPressureKpa,
      minPulseWidthMs: s.minPulseWidthMs,
      ratingFluidDensityKgPerL: s.ratingFluidDensityKgPerL,
      deadTime: s.deadTime,
    },
  };
}
function withPump(
  input: ParsedFuelSystemInput,
  p: CatalogPart,
  quantity: number,
): ParsedFuelSystemInput {
  const s = p.specs as { curves: ParsedFuelSystemInput["pumps"][number]["curves"] };
  return { ...input, pumps: [{ label: `${p.brand} ${p.name}`, quantity, curves: s.curves }] };
}

/**
 * Ranks the catalog's parts for a build. Each candidate is sized with the build's own inputs and
 * the part's data through lib/calc, so "fits" means the same sizing the editor shows.
 */
export function recommendKit(input: ParsedFuelSystemInput, parts: CatalogPart[]): Recommendation {
  const base = sizeParsedFuelSystem(input);
  const limits = base.limits;
  const ethanol = needsEthanolRating(input);
  const of = (c: PartCategory) => parts.filter((p) => p.category === c);
  const ethanolWhy = (p: CatalogPart) =>
    ethanol && !(p.specs as { ethanolOk?: boolean }).ethanolOk
      ? R("not rated for {e}", { e: E(input.fuel.ethanolMaxVolPct) })
      : null;

  // Injectors: enough flow at the build's ΔP for the design duty at the richest blend, and a
  // pulse width at idle not below the injector's minimum.
  const injectors: Draft[] = of("injector").map((p) => {
    const r = sizeWith(withInjector(input, p));
    if (!r) return unchecked("injector", p, input.injectors.count);
    const why: Reason[] = [];
    let fits = true;
    // Duty at the worse end of the blend (calc-spec §7).
    const duty = r.injector.dutyPct;
    const dutyFigures = {
      duty: pct(duty),
      e: E(r.blend[r.blend.worstEnd].ethanolVolPct),
      design: pct(limits.designDutyPct),
    };
    if (duty > limits.designDutyPct) {
      fits = false;
      why.push(R("duty {duty} at {e} is over the {design} design duty", dutyFigures));
    } else why.push(R("duty {duty} at {e} (design {design})", dutyFigures));
    // A minimum pulse width is a commanded pulse (calc-spec §3): compare the commanded idle pulse
    // (opening time + dead time) where the dead time is known, else the opening time.
    const commanded = r.injector.pulseWidthIdle.commandedMs;
    const idle = commanded ?? r.injector.pulseWidthIdle.effectiveMs;
    const minPw = (p.specs as { minPulseWidthMs?: number }).minPulseWidthMs;
    const idleFigures = (min: number) => ({
      idle: { value: idle, quantity: "time" as const },
      min: { value: min, quantity: "time" as const },
    });
    if (minPw !== undefined && idle < minPw) {
      fits = false;
      why.push(
        R(
          commanded === null
            ? "too big for idle: {idle} open at idle (no dead time known), below its {min} minimum"
            : "too big for idle: {idle} commanded at idle, below its {min} minimum",
          idleFigures(minPw),
        ),
      );
    } else if (minPw !== undefined)
      why.push(
        R(
          commanded === null
            ? "idle opening time {idle} (minimum {min}; no dead time known)"
            : "idle commanded pulse {idle} (minimum {min})",
          idleFigures(minPw),
        ),
      );
    const eth = ethanolWhy(p);
    if (eth) {
      fits = false;
      why.push(eth);
    }
    why.push(stockNote(p, input.injectors.count));
    // Best: duty closest below the design duty (smallest injector that does the job).
    const score =
      (fits ? 0 : 1000) +
      Math.abs(limits.designDutyPct - duty) +
      tieBreak(p, input.injectors.count);
    return {
      role: "injector",
      part: p,
      quantity: input.injectors.count,
      fits,
      score,
      why,
      figure: duty,
    };
  });

  // Pumps: one, or two of the same when one lacks margin at rail + boost and the build's voltage.
  const pumps: Draft[] = [];
  for (const p of of("pump")) {
    const eth = ethanolWhy(p);
    let singleFits = false;
    for (const quantity of [1, 2]) {
      if (quantity === 2 && singleFits) break;
      const r = sizeWith(withPump(input, p, quantity));
      if (!r) {
        pumps.push(unchecked("pump", p, quantity));
        break;
      }
      const margin = r.pump.marginPct;
      const why = [
        R(
          `${quantity === 1 ? "one pump" : "two in parallel"}: {margin} margin at {outlet} and {voltage} (needs {min})`,
          {
            margin: pct(margin),
            outlet: { value: r.pump.outletPressureKpa, quantity: "pressure" },
            voltage: { value: r.pump.voltageUsed, quantity: "voltage" },
            min: pct(limits.minPumpMarginPct),
          },
        ),
      ];
      let fits = margin >= limits.minPumpMarginPct;
      if (quantity === 1) singleFits = fits;
      if (eth) {
        fits = false;
        why.push(eth);
      }
      why.push(stockNote(p, quantity));
      // A single pump is simpler: a pair ranks after any single that fits.
      pumps.push({
        role: "pump",
        part: p,
        quantity,
        fits,
        score:
          (fits ? 0 : 1000) +
          (quantity - 1) * 100 +
          Math.max(0, margin - limits.minPumpMarginPct) / 10 +
          tieBreak(p, quantity),
        why,
        figure: margin,
      });
    }
  }

  // Regulator: the build's kind, with the base pressure inside its range.
  const regulators: Draft[] = of("regulator").map((p) => {
    const s = p.specs as { type: string; minPressureKpa: number; maxPressureKpa: number };
    const why: Reason[] = [];
    let fits = true;
    const kind = (t: string) =>
      REGULATOR_LABELS[t as keyof typeof REGULATOR_LABELS]?.toLowerCase() ?? t;
    if (s.type !== input.regulator.type) {
      fits = false;
      why.push(R(`${kind(s.type)} regulator; the build's is ${kind(input.regulator.type)}`));
    }
    const bp = input.regulator.basePressureKpa;
    const range = {
      min: { value: s.minPressureKpa, quantity: "pressure" as const },
      max: { value: s.maxPressureKpa, quantity: "pressure" as const },
      bp: { value: bp, quantity: "pressure" as const },
    };
    if (bp < s.minPressureKpa || bp > s.maxPressureKpa) {
      fits = false;
      why.push(R("adjusts {min} to {max}; the build needs {bp}", range));
    } else why.push(R("adjusts {min} to {max}, covers {bp}", range));
    why.push(stockNote(p, 1));
    return {
      role: "regulator",
      part: p,
      quantity: 1,
      fits,
      score: (fits ? 0 : 1000) + tieBreak(p, 1),
      why,
      figure: null,
    };
  });

  // Lines: the feed's drop at full demand and the return's at idle flow under the shop's limit.
  const lineLength = (side: "feed" | "return") =>
    input.lines?.[side]?.lengthM ?? base.lines.assumedLengthM ?? 5;
  const lineCandidates = (side: "feed" | "return"): Draft[] =>
    of("line").map((p) => {
      const s = p.specs as { dash: number; insideDiameterMm: number };
      const current = input.lines?.[side];
      const seg = {
        insideDiameterMm: s.insideDiameterMm,
        lengthM: lineLength(side),
        fittingsK: current?.fittingsK ?? 0,
        roughnessMm: current?.roughnessMm,
      };
      const r = sizeWith({ ...input, lines: { ...input.lines, [side]: seg } });
      if (!r)
        return unchecked(side === "feed" ? "feed-line" : "return-line", p, Math.ceil(seg.lengthM));
      const l = side === "feed" ? r.lines.feed : r.lines.return;
      const drop = l?.pressureDropKpa ?? 0;
      const why = [
        R(
          `{dash}: {drop} over {length} at {flow} ${side === "feed" ? "(full power)" : "(idle return)"}; limit {limit}`,
          {
            dash: { value: s.dash, quantity: "anDash" },
            drop: { value: drop, quantity: "pressureDrop" },
            length: { value: seg.lengthM, quantity: "length" },
            flow: { value: l?.flowLPerH ?? 0, quantity: "volumeFlow" },
            limit: { value: limits.maxLineDropKpa, quantity: "pressureDrop" },
          },
        ),
      ];
      let fits = drop <= limits.maxLineDropKpa;
      const eth = ethanolWhy(p);
      if (eth) {
        fits = false;
        why.push(eth);
      }
      const metres = Math.ceil(seg.lengthM);
      why.push(stockNote(p, metres));
      // The smallest hose under the limit: lighter and cheaper.
      return {
        role: side === "feed" ? "feed-line" : "return-line",
        part: p,
        quantity: metres,
        fits,
        score: (fits ? 0 : 1000) + s.insideDiameterMm + tieBreak(p, metres),
        why,
        figure: drop,
      };
    });

  const feedDash = Math.min(
    ...lineCandidates("feed")
      .filter((c) => c.fits)
      .map((c) => (c.part.specs as { dash: number }).dash),
    Infinity,
  );
  // Two filters, two roles (docs/calculations.md §4.5): a coarse strainer before the pump (its
  // drop is on the suction side, so the caution level for a pre-pump drop is its budget) and a
  // fine filter after it (half the line budget). 30 µm parts the two (common practice, no source).
  const filterCandidates = (role: "pre-filter" | "filter"): Draft[] =>
    of("filter")
      .filter((p) => {
        const micron = (p.specs as { micron: number }).micron;
        return role === "pre-filter" ? micron >= STRAINER_MICRON : micron < STRAINER_MICRON;
      })
      .map((p) => {
        const s = p.specs as { micron: number; dropKpa: number; dash?: number };
        const why = [
          R("{rating}, {drop} drop", {
            rating: { value: s.micron, quantity: "filterRating" },
            drop: { value: s.dropKpa, quantity: "pressureDrop" },
          }),
        ];
        let fits: boolean;
        if (role === "pre-filter") {
          fits = s.dropKpa <= PRE_PUMP_FILTER_CAUTION_KPA;
          if (!fits)
            why.push(
              R("over the {limit} a pump's inlet side takes", {
                limit: { value: PRE_PUMP_FILTER_CAUTION_KPA, quantity: "pressureDrop" },
              }),
            );
        } else {
          fits = s.dropKpa <= limits.maxLineDropKpa / 2;
          if (!fits)
            why.push(
              R("drop over half the {limit} line budget", {
                limit: { value: limits.maxLineDropKpa, quantity: "pressureDrop" },
              }),
            );
        }
        if (s.dash !== undefined && Number.isFinite(feedDash) && s.dash < feedDash) {
          fits = false;
          why.push(
            R("{ports} ports, smaller than the {feed} feed", {
              ports: { value: s.dash, quantity: "anDash" },
              feed: { value: feedDash, quantity: "anDash" },
            }),
          );
        }
        const eth = ethanolWhy(p);
        if (eth) {
          fits = false;
          why.push(eth);
        }
        why.push(stockNote(p, 1));
        return {
          role,
          part: p,
          quantity: 1,
          fits,
          score: (fits ? 0 : 1000) + s.dropKpa + tieBreak(p, 1),
          why,
          figure: s.dropKpa,
        };
      });

  // The one rule the build sheet's warning follows too (lib/calc flexSensorAdvice, §1).
  const flex = flexSensorAdvice(input.fuel);
  const varies = flex.needed;
  const range = { low: E(input.fuel.ethanolMinVolPct), high: E(input.fuel.ethanolMaxVolPct) };
  const sensors: Draft[] = of("sensor").map((p) => ({
    role: "sensor",
    part: p,
    quantity: 1,
    fits: varies,
    score: (varies ? 0 : 1000) + tieBreak(p, 1),
    why: [
      flex.reason === "wide"
        ? R("the blend varies {low} to {high}: the ECU needs the ethanol content", range)
        : flex.reason === "narrow"
          ? R(
              "the blend varies only {low} to {high}: the fuel trims cover it, no sensor needed",
              range,
            )
          : R("the blend is fixed: no sensor needed"),
      stockNote(p, 1),
    ],
    figure: null,
  }));

  const sorted = (xs: Omit<Candidate, "stock">[]): Candidate[] =>
    xs
      .map((c) => ({
        ...c,
        stock: {
          free: Math.max(0, available(c.part)),
          needed: c.quantity,
          expectedOn: available(c.part) >= c.quantity ? null : (c.part.expectedOn ?? null),
        },
      }))
      // Ties (equal scores) keep a fixed order, whatever order the catalog came in.
      .sort((a, b) => a.score - b.score || a.part.sku.localeCompare(b.part.sku));
  return {
    roles: [
      { role: "injector", label: "Injectors", needed: true, candidates: sorted(injectors) },
      { role: "pump", label: "Fuel pump", needed: true, candidates: sorted(pumps) },
      { role: "regulator", label: "Regulator", needed: true, candidates: sorted(regulators) },
      {
        role: "feed-line",
        label: "Feed line",
        needed: true,
        candidates: sorted(lineCandidates("feed")),
      },
      {
        role: "return-line",
        label: "Return line",
        needed: true,
        candidates: sorted(lineCandidates("return")),
      },
      {
        role: "pre-filter",
        label: "Pre-pump strainer",
        needed: true,
        candidates: sorted(filterCandidates("pre-filter")),
      },
      {
        role: "filter",
        label: "Post-pump filter",
        needed: true,
        candidates: sorted(filterCandidates("filter")),
      },
      {
        role: "sensor",
        label: "Ethanol content sensor",
        needed: varies,
        candidates: sorted(sensors),
      },
    ],
  };
}

/** The build's inputs with the chosen parts' data written in (injector flow, pump curves, hose bores). */
export function applyKit(
  input: ParsedFuelSystemInput,
  chosen: { role: KitRole; part: CatalogPart; quantity: number }[],
): ParsedFuelSystemInput {
  let next = input;
  for (const c of chosen) {
    if (c.role === "injector") next = withInjector(next, c.part);
    if (c.role === "pump") next = withPump(next, c.part, c.quantity);
    if (c.role === "regulator")
      next = {
        ...next,
        regulator: {
          ...next.regulator,
          type: (c.part.specs as { type: typeof next.regulator.type }).type,
        },
      };
    if (c.role === "feed-line" || c.role === "return-line") {
      const side = c.role === "feed-line" ? "feed" : "return";
      const s = c.part.specs as { insideDiameterMm: number };
      const cur = next.lines?.[side];
      next = {
        ...next,
        lines: {
          ...next.lines,
          [side]: {
            insideDiameterMm: s.insideDiameterMm,
            lengthM: cur?.lengthM ?? 5,
            fittingsK: cur?.fittingsK ?? 0,
            ...(cur?.roughnessMm !== undefined ? { roughnessMm: cur.roughnessMm } : {}),
          },
        },
      };
    }
    // Each filter feeds its own input (docs/calculations.md §4.5).
    if (c.role === "pre-filter")
      next = {
        ...next,
        filters: {
          ...next.filters,
          prePumpDropKpa: (c.part.specs as { dropKpa: number }).dropKpa,
        },
      };
    if (c.role === "filter")
      next = {
        ...next,
        filters: {
          ...next.filters,
          postPumpDropKpa: (c.part.specs as { dropKpa: number }).dropKpa,
        },
      };
  }
  return next;
}
