// The methods behind the numbers and their published sources (the README's Methods table), limited to
// what the case uses: the outlet's kinds name their own (src/parts/).
import type { Case, Outlet } from "../../model.js";
import type { TableBlock } from "./model.js";
import { elementMethods, SUBMERGENCE_EXPONENTS } from "../../parts/registry.js";
import { RISER_METHOD } from "../../parts/riser.js";
import { BARREL_METHOD } from "../../parts/barrel.js";
import { SPILLWAY_METHOD } from "../../parts/spillway.js";
import type { Method } from "../../parts/part.js";
import type { CaseHydrology } from "../../case/hydrology.js";
import { runoffMethodWords, unitDurationWords } from "../../case/hydrology.js";

const STORAGE: Method = {
  part: "storage",
  method: "prismoid: exact volume L W d + (L + W) z d^2 + (4/3) z^2 d^3; stage-area: conic (frustum) volume between rows; stage-storage: linear between rows",
  source: "solid geometry; the project's case format",
};

const SUBMERGENCE: Method = {
  part: "submergence",
  method: `Villemonte Q = Qfree (1 - (Hd/H)^n)^0.385, n by the part's head law: ${SUBMERGENCE_EXPONENTS}, 1.5 riser rim and spillway; no reverse flow`,
  source: "Villemonte (1947), Engineering News-Record 139; FHWA HEC-22 eq 8-21",
};

const ROUTING: Method = {
  part: "routing",
  method: "storage-indication (Modified Puls), time step chosen and refined automatically",
  source: "Chow, Maidment & Mays, Applied Hydrology (1988) sec. 8.2; FHWA HEC-22 eq 8-30",
};

/** The methods the outlets use, in the order of the table. */
function methodsUsed(outlets: readonly Outlet[]): Method[] {
  return [
    STORAGE,
    ...elementMethods(outlets.flatMap((o) => o.elements)),
    ...(outlets.some((o) => o.riser) ? [RISER_METHOD] : []),
    ...(outlets.some((o) => o.barrel) ? [BARREL_METHOD] : []),
    ...(outlets.some((o) => o.spillway) ? [SPILLWAY_METHOD] : []),
    SUBMERGENCE,
    ROUTING,
  ];
}

/** A system of ponds: the links' flow both ways and the routing of the ponds together. */
const SYSTEM_METHODS: Method[] = [
  {
    part: "links between ponds",
    method:
      "a pond's outlet into another pond has that pond's stage as its downstream level; when it is higher the same parts carry water back with the levels swapped (a barrel entered at its outlet end, discharging into the chamber, which drains through the openings and rim); an outlet of a barrel alone is an equaliser pipe; tabulated over the upstream stage and over the two stages' difference near equal levels",
    source: "the project's case format (systems of ponds); FHWA HDS-5 and the parts' sources above",
  },
  {
    part: "routing of the system",
    method: "the storage-indication (trapezoidal) step of every pond at once, the coupled equations solved by Newton's method; time step chosen and refined automatically",
    source: "Chow, Maidment & Mays, Applied Hydrology (1988) sec. 8.2",
  },
];

/** Methods of the case as a whole, beside the outlet's parts. */
function caseMethods(c: Case, hydrology: CaseHydrology | null, system: boolean): string[][] {
  const rows: string[][] = [];
  if (c.storms.some((s) => s.bypass)) {
    const flow = system ? "the flow reaching the outfall (every pond draining there, spillways included)" : "the pond's outflow (spillway included)";
    rows.push(["point of analysis", `${flow} plus the bypassing runoff at each instant; its largest sum is the peak the target applies to (exact for the two broken lines)`, "the case format, \"Bypass and the point of analysis\""]);
  }
  if (hydrology && hydrology.storms.some((s) => s !== null)) {
    const sources = [...new Set(hydrology.storms.flatMap((s) => (s === null ? [] : [s.method])))];
    rows.push([
      "storms from rainfall",
      sources.map((m) => (m === "nrcs" ? `NRCS runoff (${runoffMethodWords(hydrology)}) and unit hydrograph (${unitDurationWords(hydrology)})` : "rational method, modified rational hydrograph")).join("; ") + "; see the Hydrology section",
      sources.map((m) => (m === "nrcs" ? "NRCS TR-55 (1986) ch. 2 and 3; NEH 630 ch. 16" : "FHWA HEC-22 (3rd ed., 2009) ch. 3 and 8")).join("; "),
    ]);
  }
  return rows;
}

/**
 * The methods and sources of a report on these outlets (each row from the parts the outlets use) and
 * of the case's hydrology; `system`: a system of ponds (links both ways, the ponds routed together).
 */
export function methodsTable(c: Case, outlets: readonly Outlet[], hydrology: CaseHydrology | null = null, system = false): TableBlock {
  const methods = methodsUsed(outlets).map((m) => (system && m === SUBMERGENCE ? { ...m, method: m.method.replace("; no reverse flow", "; between ponds from whichever side is lower") } : m));
  return {
    kind: "table",
    caption: "Methods and their published sources",
    head: ["Part", "Method", "Source"],
    numeric: [false, false, false],
    rows: [...caseMethods(c, hydrology, system), ...[...methods, ...(system ? SYSTEM_METHODS : [])].filter((m) => !(system && m === ROUTING)).map((m) => [m.part, m.method, m.source])],
  };
}
