// The methods behind the numbers and their published sources (the README's Methods table), limited to
// what the case uses: the outlet's kinds name their own (src/parts/).
import type { Case, Outlet } from "../../model.js";
import type { TableBlock } from "./model.js";
import { elementMethods, SUBMERGENCE_EXPONENTS } from "../../parts/registry.js";
import { RISER_METHOD } from "../../parts/riser.js";
import { BARREL_METHOD } from "../../parts/barrel.js";
import { SPILLWAY_METHOD } from "../../parts/spillway.js";
import type { Method } from "../../parts/part.js";

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

/** The methods and sources of a report on these outlets (each row from the parts the outlets use). */
export function methodsTable(_case: Case, outlets: readonly Outlet[]): TableBlock {
  return {
    kind: "table",
    caption: "Methods and their published sources",
    head: ["Part", "Method", "Source"],
    numeric: [false, false, false],
    rows: methodsUsed(outlets).map((m) => [m.part, m.method, m.source]),
  };
}
