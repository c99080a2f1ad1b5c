// Invented pond and routed results for rule tests: a pond from 100 m to 106 m, two storms.
import type { Case, Outlet, Storm } from "../../src/model.js";
import type { StormRouting } from "../../src/routing/routeCase.js";
import type { RouteResult } from "../../src/routing/router.js";

export function storm(name: string, returnPeriod: number, target: number | null): Storm {
  const governingLimit = target === null ? null : { form: "target" as const, flow: target, statement: "target", label: null };
  return { name, returnPeriod, target, releaseLimits: governingLimit ? [governingLimit] : [], governingLimit, ceiling: null, bypass: null, points: [], inflow: { times: [0, 3600], flows: [0, 0] } } as unknown as Storm;
}

export function testCase(storms: Storm[], criteria: Partial<Case["criteria"]> = {}): Case {
  return {
    name: "rule test pond",
    units: "SI",
    file: "",
    pond: { bottom: 100, top: 106, pool: 100, storage: { kind: "prismoid", length: 60, width: 30, sideSlope: 3 } },
    tailwater: { kind: "free" } as Case["tailwater"],
    storms,
    criteria: { over: 0, under: 0.1, freeboardDepth: 0.3, freeboardStorm: storms[storms.length - 1].name, drawdownHours: null, drawdownDepth: 0.03, spillwayDryThrough: 100, blockedOutlet: null, clogging: null, extendedDetention: [], minimumOpening: null, buildability: { web: 0.15, levelSpacing: 0.075, rimClearance: 0.075, headwallWidth: null, labels: { web: "common practice", levelSpacing: "common practice", rimClearance: "common practice" } }, labels: { freeboard: null, drawdown: null, spillway: null, overtopping: null }, ...criteria },
    costs: {},
  };
}

export function routed(s: Storm, peakOutflow: number, maxStage: number, drawdownHours: number | null = 10): StormRouting {
  const result = { peakOutflow, peakAtPoint: peakOutflow, maxStage, drawdownTime: drawdownHours === null ? null : drawdownHours * 3600 } as RouteResult;
  return { storm: s, result };
}

export const NO_SPILLWAY = { elements: [] } as unknown as Outlet;
