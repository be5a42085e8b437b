import {
  sizeParsedFuelSystem,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
} from "@/lib/calc";
import { type KitRole } from "@/lib/domain/builds";
import { type PartCategory } from "@/lib/domain/parts";

/** A catalog part as the recommender needs it. */
export interface CatalogPart {
  id: string;
  sku: string;
  brand: string;
  name: string;
  category: PartCategory;
  priceMinor: number;
  stock: number;
  reserved: number;
  specs: Record<string, unknown>;
}

export interface Candidate {
  role: KitRole;
  part: CatalogPart;
  quantity: number;
  fits: boolean;
  /** Lower is better: fit first, then price, then stock. */
  score: number;
  why: string[];
  /** The figure the part was judged on (duty %, margin %, drop kPa). */
  figure: number | null;
}

export interface Recommendation {
  roles: { role: KitRole; label: string; needed: boolean; candidates: Candidate[] }[];
}

const available = (p: CatalogPart) => p.stock - p.reserved;
const stockNote = (p: CatalogPart, qty: number) =>
  available(p) >= qty
    ? `${available(p)} in stock`
    : available(p) > 0
      ? `only ${available(p)} in stock (needs ${qty})`
      : "not in stock";
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
    deadTime?: ParsedFuelSystemInput["injectors"]["deadTime"];
  };
  return {
    ...input,
    injectors: {
      count: input.injectors.count,
      ratedFlowCcPerMin: s.ratedFlowCcPerMin,
      ratedPressureKpa: s.ratedPressureKpa,
      minPulseWidthMs: s.minPulseWidthMs,
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
      ? `not rated for E${input.fuel.ethanolMaxVolPct}`
      : null;

  // Injectors: enough flow at the build's ΔP for the design duty at the richest blend, and a
  // pulse width at idle not below the injector's minimum.
  const injectors: Candidate[] = of("injector").map((p) => {
    const r = sizeParsedFuelSystem(withInjector(input, p));
    const why: string[] = [];
    let fits = true;
    const duty = r.blend.rich.dutyPct;
    if (duty > limits.designDutyPct) {
      fits = false;
      why.push(
        `duty ${duty.toFixed(0)} % at E${input.fuel.ethanolMaxVolPct} is over the ${limits.designDutyPct} % design duty`,
      );
    } else
      why.push(
        `duty ${duty.toFixed(0)} % at E${input.fuel.ethanolMaxVolPct} (design ${limits.designDutyPct} %)`,
      );
    const idle = r.injector.pulseWidthIdle.effectiveMs;
    const minPw = (p.specs as { minPulseWidthMs?: number }).minPulseWidthMs;
    if (minPw !== undefined && idle < minPw) {
      fits = false;
      why.push(
        `too big for idle: ${idle.toFixed(2)} ms open at idle, below its ${minPw} ms minimum`,
      );
    } else if (minPw !== undefined)
      why.push(`idle pulse ${idle.toFixed(2)} ms (minimum ${minPw} ms)`);
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
  const pumps: Candidate[] = [];
  for (const p of of("pump")) {
    const eth = ethanolWhy(p);
    let singleFits = false;
    for (const quantity of [1, 2]) {
      if (quantity === 2 && singleFits) break;
      const r: FuelSystemResult = sizeParsedFuelSystem(withPump(input, p, quantity));
      const margin = r.pump.marginPct;
      const why = [
        `${quantity === 1 ? "one pump" : "two in parallel"}: ${margin.toFixed(0)} % margin at ${r.pump.outletPressureKpa.toFixed(0)} kPa and ${r.pump.voltageUsed.toFixed(1)} V (needs ${limits.minPumpMarginPct} %)`,
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
  const regulators: Candidate[] = of("regulator").map((p) => {
    const s = p.specs as { type: string; minPressureKpa: number; maxPressureKpa: number };
    const why: string[] = [];
    let fits = true;
    if (s.type !== input.regulator.type) {
      fits = false;
      why.push(`${s.type} regulator; the build is ${input.regulator.type}`);
    }
    const bp = input.regulator.basePressureKpa;
    if (bp < s.minPressureKpa || bp > s.maxPressureKpa) {
      fits = false;
      why.push(`adjusts ${s.minPressureKpa}–${s.maxPressureKpa} kPa; the build needs ${bp} kPa`);
    } else why.push(`adjusts ${s.minPressureKpa}–${s.maxPressureKpa} kPa, covers ${bp} kPa`);
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
  const lineCandidates = (side: "feed" | "return"): Candidate[] =>
    of("line").map((p) => {
      const s = p.specs as { dash: number; insideDiameterMm: number };
      const current = input.lines?.[side];
      const seg = {
        insideDiameterMm: s.insideDiameterMm,
        lengthM: lineLength(side),
        fittingsK: current?.fittingsK ?? 0,
        filterDropKpa: current?.filterDropKpa ?? 0,
        roughnessMm: current?.roughnessMm,
      };
      const r = sizeParsedFuelSystem({ ...input, lines: { ...input.lines, [side]: seg } });
      const l = side === "feed" ? r.lines.feed : r.lines.return;
      const drop = l?.pressureDropKpa ?? 0;
      const why = [
        `−${s.dash} AN: ${drop.toFixed(1)} kPa over ${seg.lengthM} m at ${(l?.flowLPerH ?? 0).toFixed(0)} L/h ${side === "feed" ? "(full power)" : "(idle return)"}; limit ${limits.maxLineDropKpa} kPa`,
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
  const filters: Candidate[] = of("filter").map((p) => {
    const s = p.specs as { micron: number; dropKpa: number; dash?: number };
    const why = [`${s.micron} µm, ${s.dropKpa} kPa drop`];
    let fits = s.dropKpa <= limits.maxLineDropKpa / 2;
    if (!fits) why.push(`drop over half the ${limits.maxLineDropKpa} kPa line budget`);
    if (s.dash !== undefined && Number.isFinite(feedDash) && s.dash < feedDash) {
      fits = false;
      why.push(`−${s.dash} ports, smaller than the −${feedDash} feed`);
    }
    const eth = ethanolWhy(p);
    if (eth) {
      fits = false;
      why.push(eth);
    }
    why.push(stockNote(p, 1));
    return {
      role: "filter",
      part: p,
      quantity: 1,
      fits,
      score: (fits ? 0 : 1000) + s.dropKpa + tieBreak(p, 1),
      why,
      figure: s.dropKpa,
    };
  });

  const varies = input.fuel.ethanolMinVolPct !== input.fuel.ethanolMaxVolPct;
  const sensors: Candidate[] = of("sensor").map((p) => ({
    role: "sensor",
    part: p,
    quantity: 1,
    fits: varies,
    score: (varies ? 0 : 1000) + tieBreak(p, 1),
    why: [
      varies
        ? `the blend varies E${input.fuel.ethanolMinVolPct}–E${input.fuel.ethanolMaxVolPct}: the ECU needs the ethanol content`
        : "the blend is fixed: no sensor needed",
      stockNote(p, 1),
    ],
    figure: null,
  }));

  const sorted = (xs: Candidate[]) => xs.sort((a, b) => a.score - b.score);
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
      { role: "filter", label: "Filter", needed: true, candidates: sorted(filters) },
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
            filterDropKpa: cur?.filterDropKpa ?? 0,
            ...(cur?.roughnessMm !== undefined ? { roughnessMm: cur.roughnessMm } : {}),
          },
        },
      };
    }
    if (c.role === "filter" && next.lines?.feed)
      next = {
        ...next,
        lines: {
          ...next.lines,
          feed: {
            ...next.lines.feed,
            filterDropKpa: (c.part.specs as { dropKpa: number }).dropKpa,
          },
        },
      };
  }
  return next;
}
