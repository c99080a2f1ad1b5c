// Every storm's storage estimates side by side, with the stage each reaches in the case's pond and
// whether it stays below the storm's limit level (the lower of the freeboard level and, for a storm
// that must keep the spillway dry, the spillway crest; an underground system's top).
// - Published methods: TR-55 ch. 6 and the modified rational critical duration.
// - Hydrograph differences (rising and constant release): lower bounds. The constant release is the
//   least storage any outlet that holds the peak to the target needs (it never releases more than the
//   target); the rising release starts at the first runoff, hours before the peak of a 24-hour storm,
//   so it is within about 1 % of the constant release there and far below what real outlets use.
// - Routed estimates (sizing/routedEstimate.ts): each storm routed through notional outlets of the
//   usual kinds, each sized so its peak meets the target; what outlets of those shapes use. `pond`
//   sizes to the largest of them (`sizingEstimate`).
import type { Case, Pond, Storm } from "../model.js";
import type { CriticalDuration } from "../hydrology/rational.js";
import { hydrographDifference, hydrographFacts, TR55_RATIO_RANGE, tr55StorageRatio, type Tr55Group } from "../storage/estimate.js";
import { stageAtVolume } from "../storage/stageAtVolume.js";
import { limitLevel, storageBelow, type LimitLevel } from "../storage/limitLevel.js";
import { NOTIONAL_WORDS, routedEstimates, type NotionalKind, type NotionalResult } from "./routedEstimate.js";

export type RoutedMethod = `routed-${NotionalKind}`;
export type EstimateMethod = "tr55" | "rising-release" | "constant-release" | "modified-rational" | RoutedMethod;

export interface MethodSource {
  label: string;
  source: string;
  /** A lower bound on the storage an outlet needs (the hydrograph differences). */
  lowerBound: boolean;
}

const routedSource = (kind: NotionalKind, how: string): MethodSource => ({
  label: `routed: ${NOTIONAL_WORDS[kind]}`,
  source: `routed estimate: the storm routed through ${how}, sized so its routed peak meets the middle of the target band (at most 10 % below the target)`,
  lowerBound: false,
});

export const METHOD_SOURCES: Readonly<Record<EstimateMethod, MethodSource>> = {
  tr55: { label: "TR-55 ch. 6 chart", source: "NRCS TR-55 (1986) ch. 6, Figure 6-1; coefficients App. F Table F-2", lowerBound: false },
  "rising-release": {
    label: "rising release (lower bound)",
    source: "hydrograph difference, a lower bound: the inflow above a release rising linearly from the start of runoff to the target at the inflow's peak, then held",
    lowerBound: true,
  },
  "constant-release": {
    label: "constant release (lower bound)",
    source: "hydrograph difference, a lower bound: the inflow above the target throughout, the least storage any outlet that holds the peak to the target needs",
    lowerBound: true,
  },
  "modified-rational": { label: "modified rational", source: "modified rational method: the largest V = Qp td - Qa (td + Tc)/2 over storm durations td (the critical duration)", lowerBound: false },
  "routed-orifice": routedSource("orifice", "one orifice at the pool (or floor)"),
  "routed-weir": routedSource("weir", "one rectangular weir with its crest at the pool (or floor)"),
  "routed-two-stage": routedSource("two-stage", "an orifice sized for the smallest storm and, above the stage that storm reaches, a weir"),
  "routed-multi-stage": routedSource("multi-stage", "an orifice for the smallest storm and a weir per larger storm, each crest at the stage the storm below reaches"),
};

export interface MethodEstimate {
  method: EstimateMethod;
  /** m3 above the permanent pool; null when the method does not apply. */
  volume: number | null;
  /** Stage reached in the case's pond (m): Infinity beyond what the storage holds; null without a volume or before a pond. */
  stage: number | null;
  /** Whether that stage is at or below the storm's limit level; null without a volume or a pond. */
  fits: boolean | null;
  /** Why the method does not apply, or what it assumed. */
  note: string | null;
  /** TR-55: the release ratio lies outside the range Figure 6-1 is drawn for (the estimate is extrapolated). */
  outsideRange: boolean;
  /** A storm of several durations routed: the duration that governs (s). */
  governingDuration: number | null;
  /** The notional outlet of a routed estimate. */
  notional: NotionalResult | null;
}

export interface StormEstimate {
  storm: Storm;
  peakInflow: number;
  inflowVolume: number;
  methods: MethodEstimate[];
  /** The storm's limit level in the case's pond; null before a pond. */
  limit: LimitLevel | null;
  /** Storage between the pool and the limit level (m3); null before a pond. */
  available: number | null;
  /** The critical duration of a rational storm by the modified rational formula (s). */
  criticalDuration: number | null;
}

export interface StormEstimateInputs {
  /** TR-55 storm-type group, or null when unknown. */
  group: Tr55Group | null;
  /** The modified rational duration sweep of a rational-method storm. */
  rational: CriticalDuration | null;
}

/** Freeboard level (m): top of embankment less the freeboard depth. */
export function freeboardLevel(c: Case): number {
  return c.pond.top - c.criteria.freeboardDepth;
}

/** A storm's limit level in the case's pond. */
export function caseLimitLevel(c: Case, storm: Storm, pond: Pond = c.pond): LimitLevel {
  return limitLevel(pond, c.criteria, c.outlet?.spillway, storm.returnPeriod);
}

const estimateOf = (method: EstimateMethod, volume: number | null, note: string | null, extra: Partial<MethodEstimate> = {}): MethodEstimate => ({
  method,
  volume,
  stage: null,
  fits: null,
  note,
  outsideRange: false,
  governingDuration: null,
  notional: null,
  ...extra,
});

/** The published methods' and the hydrograph differences' volumes, before any pond. */
export function stormVolumes(storm: Storm, inputs: StormEstimateInputs): StormEstimate {
  const facts = hydrographFacts(storm.inflow);
  const methods: MethodEstimate[] = [];
  const target = storm.target;
  if (target === null) {
    for (const method of ["tr55", "rising-release", "constant-release"] as const) methods.push(estimateOf(method, null, "no target"));
  } else {
    const ratio = target / facts.peak;
    if (inputs.group === null) methods.push(estimateOf("tr55", null, "storm type unknown (give --type, or a rainfall distribution)"));
    else if (ratio >= 1) methods.push(estimateOf("tr55", 0, "target at or above the peak inflow"));
    else {
      const [low, high] = TR55_RATIO_RANGE;
      const outside = ratio < low || ratio > high;
      const note = outside ? `qo/qi ${ratio.toFixed(2)} outside the chart's ${low}-${high}: extrapolated` : `type ${inputs.group}, qo/qi ${ratio.toFixed(2)}`;
      methods.push(estimateOf("tr55", Math.max(0, tr55StorageRatio(ratio, inputs.group)) * facts.volume, note, { outsideRange: outside }));
    }
    methods.push(estimateOf("rising-release", hydrographDifference(storm.inflow, target, "rising"), null));
    methods.push(estimateOf("constant-release", hydrographDifference(storm.inflow, target, "constant"), null));
  }
  if (inputs.rational) methods.push(estimateOf("modified-rational", inputs.rational.critical.storage, `critical duration ${(inputs.rational.critical.duration / 60).toFixed(0)} min`));
  return { storm, peakInflow: facts.peak, inflowVolume: facts.volume, methods, limit: null, available: null, criticalDuration: inputs.rational ? inputs.rational.critical.duration : null };
}

/** Every storm's estimates in the case's pond: the published methods, the lower bounds and the routed estimates, each with its stage and whether it stays below the storm's limit level. */
export function caseEstimates(c: Case, inputs: readonly StormEstimateInputs[]): StormEstimate[] {
  const routed = routedEstimates({ pond: c.pond, tailwater: c.tailwater, storms: c.storms, drawdownDepth: c.criteria.drawdownDepth, over: c.criteria.over, under: c.criteria.under });
  return c.storms.map((storm, i) => {
    const e = stormVolumes(storm, inputs[i]);
    const limit = caseLimitLevel(c, storm);
    e.limit = limit;
    e.available = storageBelow(c.pond, limit.level);
    for (const m of e.methods) {
      if (m.volume === null) continue;
      m.stage = stageAtVolume(c.pond, m.volume);
      m.fits = m.stage <= limit.level + 1e-9;
    }
    const r = routed.find((x) => x.storm === storm);
    for (const n of r?.results ?? []) {
      const beyond = n.storage > e.available + 1e-9 && !Number.isFinite(stageAtVolume(c.pond, n.storage));
      e.methods.push(
        estimateOf(`routed-${n.kind}`, n.storage, n.note ?? (beyond ? "more than the storage holds" : null), {
          stage: beyond ? Infinity : n.stage,
          fits: !beyond && n.stage <= limit.level + 1e-9,
          governingDuration: n.governingDuration,
          notional: n,
        }),
      );
    }
    return e;
  });
}

/** The estimate `pond` sizes to: the largest routed estimate of any storm (not a lower bound); null when no storm has a target. */
export function sizingEstimate(estimates: readonly StormEstimate[]): { volume: number; storm: string; method: EstimateMethod } | null {
  let best: { volume: number; storm: string; method: EstimateMethod } | null = null;
  for (const e of estimates) {
    for (const m of e.methods) {
      if (!m.method.startsWith("routed-") || m.volume === null) continue;
      if (best === null || m.volume > best.volume) best = { volume: m.volume, storm: e.storm.name, method: m.method };
    }
  }
  return best;
}

/** The lowest limit level of the storms with a target (the tightest), in the case's pond. */
export function lowestLimitLevel(c: Case, pond: Pond = c.pond): LimitLevel {
  let lowest: LimitLevel | null = null;
  for (const s of c.storms) {
    if (s.target === null) continue;
    const l = caseLimitLevel(c, s, pond);
    if (lowest === null || l.level < lowest.level) lowest = l;
  }
  return lowest ?? limitLevel(pond, c.criteria, c.outlet?.spillway, Infinity);
}

/** Storage (m3) the pond holds between its permanent pool and the lowest limit level of the storms with a target. */
export function availableStorage(c: Case, pond: Pond = c.pond): number {
  return storageBelow(pond, lowestLimitLevel(c, pond).level);
}
