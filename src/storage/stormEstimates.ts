// Every storm's storage estimates side by side, with the stage each reaches in the case's pond and
// whether it stays below the freeboard level (top of embankment less the freeboard depth).
import type { Case, Pond, Storm } from "../model.js";
import type { CriticalDuration } from "../hydrology/rational.js";
import {
  hydrographDifference,
  hydrographFacts,
  TR55_RATIO_RANGE,
  tr55StorageRatio,
  type Tr55Group,
} from "./estimate.js";
import { stageAtVolume } from "./stageAtVolume.js";
import { storageCurve } from "./curve.js";

export type EstimateMethod = "tr55" | "rising-release" | "constant-release" | "modified-rational";

export const METHOD_SOURCES: Readonly<Record<EstimateMethod, { label: string; source: string }>> = {
  tr55: { label: "TR-55 ch. 6 chart", source: "NRCS TR-55 (1986) ch. 6, Figure 6-1; coefficients App. F Table F-2" },
  "rising-release": { label: "rising release", source: "hydrograph difference: the inflow above a release rising linearly from the start of runoff to the target at the inflow's peak, then held" },
  "constant-release": { label: "constant release", source: "hydrograph difference: the inflow above the target throughout (holds less than the rising release: it releases the target from the start)" },
  "modified-rational": { label: "modified rational", source: "modified rational method: the largest V = Qp td - Qa (td + Tc)/2 over storm durations td (the critical duration)" },
};

export interface MethodEstimate {
  method: EstimateMethod;
  /** m3 above the permanent pool; null when the method does not apply. */
  volume: number | null;
  /** Stage reached in the case's pond (m); null without a volume. */
  stage: number | null;
  /** Whether that stage is at or below the freeboard level; null without a volume. */
  fits: boolean | null;
  /** Why the method does not apply, or a caution about its range. */
  note: string | null;
}

export interface StormEstimate {
  storm: Storm;
  peakInflow: number;
  inflowVolume: number;
  methods: MethodEstimate[];
  /** Largest volume among the methods that apply (m3), null when none does. */
  largest: number | null;
  /** The critical duration of a rational storm (s). */
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

/** The estimates' volumes, before any pond: `stage` and `fits` are null. */
export function stormVolumes(storm: Storm, inputs: StormEstimateInputs): StormEstimate {
  const facts = hydrographFacts(storm.inflow);
  const methods: MethodEstimate[] = [];
  const place = (method: EstimateMethod, volume: number | null, note: string | null): void => {
    methods.push({ method, volume, stage: null, fits: null, note });
  };
  const target = storm.target;
  if (target === null) {
    for (const method of ["tr55", "rising-release", "constant-release"] as const) place(method, null, "no target");
  } else {
    const ratio = target / facts.peak;
    if (inputs.group === null) place("tr55", null, "storm type unknown (give --type, or a rainfall distribution)");
    else if (ratio >= 1) place("tr55", 0, "target at or above the peak inflow");
    else {
      const [low, high] = TR55_RATIO_RANGE;
      const outside = ratio < low || ratio > high ? `qo/qi ${ratio.toFixed(2)} outside the chart's ${low}-${high}` : null;
      place("tr55", Math.max(0, tr55StorageRatio(ratio, inputs.group)) * facts.volume, outside ?? `type ${inputs.group}, qo/qi ${ratio.toFixed(2)}`);
    }
    place("rising-release", hydrographDifference(storm.inflow, target, "rising"), null);
    place("constant-release", hydrographDifference(storm.inflow, target, "constant"), null);
  }
  if (inputs.rational) place("modified-rational", inputs.rational.critical.storage, null);
  const volumes = methods.map((m) => m.volume).filter((v): v is number => v !== null);
  return {
    storm,
    peakInflow: facts.peak,
    inflowVolume: facts.volume,
    methods,
    largest: volumes.length ? Math.max(...volumes) : null,
    criticalDuration: inputs.rational ? inputs.rational.critical.duration : null,
  };
}

/** The estimates with the stage each reaches in the case's pond and whether it fits below the freeboard level. */
export function estimateStorm(c: Case, storm: Storm, inputs: StormEstimateInputs): StormEstimate {
  const e = stormVolumes(storm, inputs);
  for (const m of e.methods) {
    if (m.volume === null) continue;
    m.stage = stageAtVolume(c.pond, m.volume);
    m.fits = m.stage <= freeboardLevel(c) + 1e-9;
  }
  return e;
}

/** The largest volume of any method and storm, with where it comes from; null when no storm has a target. */
export function governingVolume(estimates: readonly StormEstimate[]): { volume: number; storm: string; method: EstimateMethod } | null {
  let best: { volume: number; storm: string; method: EstimateMethod } | null = null;
  for (const e of estimates) for (const m of e.methods) if (m.volume !== null && (best === null || m.volume > best.volume)) best = { volume: m.volume, storm: e.storm.name, method: m.method };
  return best;
}

/** Storage (m3) the pond holds between its permanent pool and the freeboard level. */
export function availableStorage(c: Case, pond: Pond = c.pond): number {
  const curve = storageCurve(pond);
  return Math.max(0, curve.volume(pond.top - c.criteria.freeboardDepth) - curve.volume(pond.pool));
}
