// The methods behind the numbers and their published sources (the README's Methods table), limited to
// what the case uses.
import type { Case, Outlet } from "../../model.js";
import type { TableBlock } from "./model.js";

interface Method {
  part: string;
  method: string;
  source: string;
  applies(c: Case, outlet: Outlet): boolean;
}

const hasElement = (outlet: Outlet, test: (e: Outlet["elements"][number]) => boolean) => outlet.elements.some(test);

const METHODS: Method[] = [
  {
    part: "storage",
    method: "prismoid: exact volume L W d + (L + W) z d^2 + (4/3) z^2 d^3; stage-area: conic (frustum) volume between rows; stage-storage: linear between rows",
    source: "solid geometry; the project's case format",
    applies: () => true,
  },
  {
    part: "orifice",
    method: "orifice equation integrated over the wetted opening, head to the downstream level where submerged; default Cd 0.61",
    source: "FHWA HEC-22 (3rd ed., 2009) eq 8-17; USBR Water Measurement Manual (3rd ed.)",
    applies: (_, o) => hasElement(o, (e) => e.type === "orifice"),
  },
  {
    part: "rectangular weir",
    method: "Francis Q = C (L - 0.1 n H) H^1.5; default C 3.33 US / 1.84 SI",
    source: "FHWA HEC-22 (3rd ed., 2009) eqs 8-19, 8-20",
    applies: (_, o) => hasElement(o, (e) => e.type === "weir" && e.shape === "rectangular"),
  },
  {
    part: "v-notch weir",
    method: "Q = C tan(angle/2) H^2.5; default C 2.50 US / 1.38 SI",
    source: "FHWA HEC-22 (3rd ed., 2009) eq 8-23",
    applies: (_, o) => hasElement(o, (e) => e.type === "weir" && e.shape === "v-notch"),
  },
  {
    part: "riser rim",
    method: "smaller of weir flow over the perimeter and orifice flow through the top; default Cw 3.0 US / 1.66 SI, Cd 0.60",
    source: "FHWA HEC-22 (3rd ed., 2009) sec. 8.4.4.2, Example 8-6",
    applies: (_, o) => o.riser !== undefined,
  },
  {
    part: "barrel",
    method: "inlet control (unsubmerged and submerged forms, blended between) and full-flow outlet control; the larger headwater governs; chamber level solved against the barrel",
    source: "FHWA HDS-5, Hydraulic Design of Highway Culverts (2nd ed. 2001, 3rd ed. 2012), App. A and ch. III",
    applies: (_, o) => o.barrel !== undefined,
  },
  {
    part: "spillway",
    method: "broad-crested trapezoid Q = C (L H^1.5 + 0.8 z H^2.5); default C 2.8 US / 1.55 SI",
    source: "FHWA HEC-22 (3rd ed., 2009) eq 8-22, Table 8-1",
    applies: (_, o) => o.spillway !== undefined,
  },
  {
    part: "regulator",
    method: "maker's rating, monotone cubic interpolation",
    source: "Fritsch & Carlson (1980), SIAM J. Numer. Anal. 17(2)",
    applies: (_, o) => hasElement(o, (e) => e.type === "regulator"),
  },
  {
    part: "submergence",
    method: "Villemonte Q = Qfree (1 - (Hd/H)^n)^0.385, n 1.5 (2.5 v-notch); no reverse flow",
    source: "Villemonte (1947), Engineering News-Record 139; FHWA HEC-22 eq 8-21",
    applies: () => true,
  },
  {
    part: "routing",
    method: "storage-indication (Modified Puls), time step chosen and refined automatically",
    source: "Chow, Maidment & Mays, Applied Hydrology (1988) sec. 8.2; FHWA HEC-22 eq 8-30",
    applies: () => true,
  },
];

export function methodsTable(c: Case, outlets: readonly Outlet[]): TableBlock {
  return {
    kind: "table",
    caption: "Methods and their published sources",
    head: ["Part", "Method", "Source"],
    numeric: [false, false, false],
    rows: METHODS.filter((m) => outlets.some((o) => m.applies(c, o))).map((m) => [m.part, m.method, m.source]),
  };
}
