// Clogging: an assumed blocked share of the open area of the openings under a trash rack. Not a check
// of its own: checks.ts routes the clogged outlet once and evaluates the named rules on it as well,
// so each of their checks appears with and without clogging ("clogged" checks, key `kind:storm:clogged`).
import type { Case, Outlet } from "../../model.js";
import { partOf } from "../../parts/registry.js";

/**
 * The outlet with `fraction` of every opening's open area blocked: an orifice's discharge coefficient,
 * a weir's coefficient and a regulator's rated flows scaled by (1 - fraction), i.e. the effective
 * area (orifice) or length (weir) reduced in proportion. The riser rim and the spillway are left open
 * (a rim grate is a separate assumption). 50 % is common practice for small openings, not a
 * published constant.
 */
export function cloggedOutlet(outlet: Outlet, fraction: number): Outlet {
  const open = 1 - fraction;
  const elements = outlet.elements.map((e) => partOf(e).clogged(e, open));
  return { ...outlet, elements };
}

/** Whether checks of `kind` are also evaluated with the openings clogged. */
export function cloggingApplies(c: Case, kind: string, comparison: "at most" | "at least"): boolean {
  const clog = c.criteria.clogging;
  if (!clog) return false;
  return clog.checks === null ? comparison === "at most" : clog.checks.includes(kind);
}
