// A system of ponds as the search sees each of its ponds: the case as one pond of it would be designed
// alone (its pond, its outlet, its tailwater, the storms reaching it), the view from which that pond's
// part options, kept parts and elevation limits are built, and on which its layouts are planned and its
// elevations staged. The view's storms are a surrogate: each pond receives its own inflow and that of
// every pond upstream of it (not attenuated), and aims at its own target where the case gives one,
// else at the system's target in proportion to the volume that reaches it. Only the plan and the
// staged starts use them; every fit and every candidate is judged by the system routed together.
import type { Case, Storm, Tailwater } from "../../src/model.js";
import type { CaseFile, OutletFile } from "../../src/case/schema.js";
import { sumHydrographs } from "../../src/hydrology/hydrograph.js";
import { hydrographVolume } from "../../src/hydrology/hydrograph.js";
import { stormOfPond } from "../../src/assess/systemAssess.js";

/** The ponds whose water reaches pond `index` (itself and every pond upstream of it). */
export function pondsReaching(c: Case, index: number): number[] {
  const to = c.system!.ponds.map((p) => p.to);
  return to.flatMap((_, k) => {
    for (let j = k; j >= 0; j = to[j]) if (j === index) return [k];
    return [];
  });
}

/** A storm as pond `index` sees it in the search's surrogate (see the file's head). */
function viewStorm(c: Case, storm: Storm, index: number, reaching: readonly number[]): Storm {
  const system = c.system!;
  const own = storm.inflows ?? system.ponds.map(() => null);
  const inflow = sumHydrographs(reaching.map((k) => own[k]));
  const total = own.reduce((sum, h) => sum + (h ? hydrographVolume(h) : 0), 0);
  const share = total > 0 ? hydrographVolume(inflow) / total : 1;
  const atOutfall = system.ponds[index].to < 0;
  const alone = atOutfall && system.ponds.filter((p) => p.to < 0).length === 1;
  const given = storm.pondTargets?.[index] ?? null;
  const target = given ?? (storm.target === null ? null : storm.target * (alone ? 1 : share));
  const statement = given !== null ? "the pond's own target" : alone ? "the system's target" : "the system's target, the pond's share by volume";
  return stormOfPond(storm, inflow, target, statement, alone ? storm.bypass : null);
}

/** Pond `index` of a system as the search designs it: its view of the case and of the case file. */
export function pondDesignView(c: Case, file: CaseFile, index: number): { case: Case; file: CaseFile } {
  const system = c.system!;
  const p = system.ponds[index];
  const reaching = pondsReaching(c, index);
  const { system: _system, ...rest } = c;
  // A pond draining into another has that pond's permanent pool (or floor) as its tailwater: the level it returns to.
  const tailwater: Tailwater = p.to < 0 ? c.tailwater : { kind: "elevation", elevation: system.ponds[p.to].pond.pool };
  const view: Case = { ...rest, pond: p.pond, outlet: p.outlet, tailwater, storms: c.storms.map((s) => viewStorm(c, s, index, reaching)) };
  const entry = file.ponds![index];
  const { ponds: _ponds, ...fileRest } = file;
  const viewFile: CaseFile = { ...fileRest, pond: entry.pond, outlet: entry.outlet as OutletFile };
  return { case: view, file: viewFile };
}
