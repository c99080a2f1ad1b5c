// Physically implausible input that the schema cannot see (it needs several fields or the routed
// result): an opening above the top of embankment or below the floor, an orifice wider than its
// riser or taller than the pond, a riser narrower than its barrel, a pond that stores nothing, an
// inflow cut off far from zero, a routing whose mass balance is off, a size given as a bare number that
// is implausible in the case's unit (case/sizePlausibility.ts). Each warning names the part,
// the value and why; the case still routes (the engineer may mean it), but not without a word.
import type { Case, Outlet } from "../model.js";
import type { CaseRouting } from "../routing/routeCase.js";
import { formatter } from "../format.js";
import { isHole, outlineHeight, outlineWidth } from "../parts/outline.js";
import { partOf } from "../parts/registry.js";
import { riserAcross } from "../parts/riser.js";
import { barrelRise } from "../parts/barrel.js";
import { partLabel, type Warning } from "./warnings.js";

/** Mass balance error above which a routing is flagged: 0.01 % (the project's routing tests hold every
 * storm below it; README "Verification"). */
export const MASS_BALANCE_LIMIT = 1e-4;
/** An inflow whose last point is above this fraction of its peak was cut off, not ended (common practice). */
export const INFLOW_END_FRACTION = 0.01;

export function implausibleInputWarnings(c: Case, outlet: Outlet, routing: CaseRouting): Warning[] {
  const f = formatter(c.units);
  const warnings: Warning[] = [];
  const { bottom, top } = c.pond;
  const riserWidth = outlet.riser ? riserAcross(outlet.riser).widest : null;
  outlet.elements.forEach((e, i) => {
    const kind = partOf(e);
    const part = partLabel(e, i, f);
    const low = kind.bottom(e);
    const what = kind.bottomField;
    if (low > top + 1e-9) warnings.push({ part, reason: `${what} ${f.elevation(low)} is above the top of embankment ${f.elevation(top)}: it can pass water only when the pond overtops` });
    if (low < bottom - 1e-9) warnings.push({ part, reason: `${what} ${f.elevation(low)} is below the pond floor ${f.elevation(bottom)}: there is no storage below the floor to drain` });
    const outline = kind.outline(e);
    const height = outlineHeight(outline);
    // A closed opening cut in the wall (not a notch, open to the rim; not a device mounted on it).
    const opening = isHole(outline) && height !== null ? { width: outlineWidth(outline, 0), height } : null;
    if (opening) {
      if (riserWidth !== null && opening.width > riserWidth + 1e-9) {
        warnings.push({ part, reason: `opening ${f.length(opening.width)} wide is wider than the riser (${f.length(riserWidth)}): it cannot be cut in its wall` });
      }
      if (opening.height > top - bottom + 1e-9) {
        warnings.push({ part, reason: `opening ${f.length(opening.height)} high is taller than the pond is deep (${f.length(top - bottom)})` });
      }
    }
  });
  if (outlet.riser) {
    if (outlet.riser.crest > top + 1e-9) warnings.push({ part: "outlet.riser", reason: `rim ${f.elevation(outlet.riser.crest)} is above the top of embankment ${f.elevation(top)}` });
    if (outlet.riser.crest < bottom - 1e-9) warnings.push({ part: "outlet.riser", reason: `rim ${f.elevation(outlet.riser.crest)} is below the pond floor ${f.elevation(bottom)}` });
    const riserSmallest = riserAcross(outlet.riser).narrowest;
    if (outlet.barrel && riserSmallest < barrelRise(outlet.barrel) - 1e-9) {
      warnings.push({ part: "outlet.riser", reason: `riser ${f.length(riserSmallest)} across is smaller than the barrel it drains into (${f.length(barrelRise(outlet.barrel))} high)` });
    }
  }
  if (outlet.spillway && outlet.spillway.crest > top + 1e-9) {
    warnings.push({ part: "outlet.spillway", reason: `crest ${f.elevation(outlet.spillway.crest)} is above the top of embankment ${f.elevation(top)}: the embankment overtops first` });
  }
  // Sizes the file gave as bare numbers that are implausible (read in the case's unit), on the case's own outlet.
  if (outlet === c.outlet) for (const w of c.sizeWarnings ?? []) if (w.part.startsWith("outlet.")) warnings.push(w);
  const storageAtTop = routing.table.storage[routing.table.storage.length - 1];
  if (!(storageAtTop > 0)) warnings.push({ part: "pond.storage", reason: "the pond stores nothing up to its top: every peak passes straight through (peak out = peak in)" });
  routing.storms.forEach(({ storm, result }, i) => {
    const flows = storm.inflow.flows;
    let peak = 0;
    for (let k = 0; k < flows.length; k++) peak = Math.max(peak, flows[k]);
    const last = flows[flows.length - 1];
    if (peak > 0 && last > INFLOW_END_FRACTION * peak) {
      warnings.push({
        part: `storms[${i}].inflow (${storm.name})`,
        reason: `the inflow ends at ${f.flow(last)}, ${((100 * last) / peak).toFixed(0)} % of its peak: after its last point it is taken as zero, so the rest of the storm is missing`,
      });
    }
    if (Math.abs(result.massBalanceError) > MASS_BALANCE_LIMIT) {
      warnings.push({
        part: `routing (${storm.name})`,
        reason: `mass balance error ${(100 * result.massBalanceError).toFixed(3)} % exceeds 0.01 %: the time step is too long for this pond and inflow (leave the step automatic, or shorten it)`,
      });
    }
  });
  return warnings;
}
