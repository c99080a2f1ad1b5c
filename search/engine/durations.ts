// What the search routes for each storm: the inflow (a long fine record thinned), or for a storm of
// the modified rational method a few of its durations. Routing every duration of the range (about 25
// routings a storm, `routing/durations.ts`) for every evaluation would multiply the search's work, so
// the search routes seven durations: five evenly over the span of the durations that govern for the
// routed estimate's notional outlets (one orifice, one weir, the staged outlets) and the critical
// duration of the storage formula (the outlets the search tries lie near those shapes), and one
// beyond each end of it, half as far again. Every candidate is then routed over the whole range through
// the `route` path (`candidate.ts`), which decides compliance and names the governing duration.
import type { Case, Storm } from "../../src/model.js";
import { searchInflow } from "../../src/routing/thinInflow.js";
import type { SearchInflow } from "../../src/routing/durations.js";
import { routedEstimates } from "../../src/sizing/routedEstimate.js";

/** Durations (s) the search routes for each storm of a range: the critical one and those governing the notional outlets. */
export function searchDurations(c: Case): Map<Storm, number[]> {
  const ranged = c.storms.filter((s) => s.durations);
  const found = new Map<Storm, number[]>();
  if (ranged.length === 0) return found;
  const estimates = routedEstimates({ pond: c.pond, tailwater: c.tailwater, storms: c.storms, drawdownDepth: c.criteria.drawdownDepth, over: c.criteria.over, under: c.criteria.under });
  for (const storm of ranged) {
    const range = storm.durations!;
    const minutes = [Math.round(range.critical / 60)];
    for (const r of estimates.find((e) => e.storm === storm)?.results ?? []) if (r.governingDuration !== null) minutes.push(Math.round(r.governingDuration / 60));
    // Five evenly over the span those durations cover (the outlets tried govern near the notional
    // ones), and one beyond each end, half as far again (an outlet that holds back more than the
    // notional ones is governed by longer storms), within the range, on whole minutes.
    const lo = Math.min(...minutes);
    const hi = Math.max(...minutes);
    const set = new Set<number>();
    for (let i = 0; i < SEARCH_DURATIONS - 2; i++) set.add(Math.round(lo + ((hi - lo) * i) / (SEARCH_DURATIONS - 3)));
    set.add(Math.max(Math.ceil(range.shortest / 60), Math.round(lo / SPAN_WIDENING)));
    set.add(Math.min(Math.floor(range.longest / 60), Math.round(hi * SPAN_WIDENING)));
    found.set(storm, [...set].sort((a, b) => a - b).map((m) => m * 60));
  }
  return found;
}

/** Durations the search routes per modified rational storm (at most). */
export const SEARCH_DURATIONS = 7;
/** The span of the notional outlets' durations is widened by this factor each way. */
const SPAN_WIDENING = 1.5;

export function searchInflows(c: Case): Map<Storm, SearchInflow> {
  const durations = searchDurations(c);
  return new Map(
    c.storms.map((s): [Storm, SearchInflow] => {
      const list = durations.get(s);
      return [s, list ? { durations: list, inflows: list.map((d) => s.durations!.inflow(d)) } : searchInflow(s.inflow)];
    }),
  );
}
