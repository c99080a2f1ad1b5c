// The openings' flow at one pond stage for many downstream levels, as a rating sweeps the stages:
// each element's free flow (downstream level at or below its bottom) is computed once per stage,
// and only the elements a downstream level reaches are evaluated again for that level. The values
// are those of `openingsFlow` exactly (a part the downstream level does not reach passes its free
// flow); with `tabulated` set, a kind that has faster forms of its flow for the sweep (its `sweep`:
// the circular orifice's free flow from a dimensionless table, its submerged flow by a shorter rule)
// is rated by them, within 1e-6 of the direct value.
import type { Element, Outlet } from "../model.js";
import { partOf, type AnyElementPart } from "../parts/registry.js";
import type { SweepFlow } from "../parts/part.js";
import { rimDischarge } from "../parts/riser.js";

/** Columns kept per stage grid (each a Float64Array of the grid's length), least recently used dropped. */
export const FREE_COLUMNS_KEPT = 256;
const freeColumns = new WeakMap<Float64Array, Map<string, Float64Array>>();

/**
 * The flow of one part at every stage of a grid (an element's or the rim's free flow, the spillway's
 * at a fixed tailwater), kept by the part's values and the grid: candidates of a search that share
 * a level share its column. A pure function's memo: the values are those computed on a miss.
 */
export function freeColumn(stages: Float64Array, key: string, flowAt: (ws: number) => number, keep = true): Float64Array {
  if (!keep) return computedColumn(stages, flowAt);
  let columns = freeColumns.get(stages);
  if (!columns) {
    columns = new Map();
    freeColumns.set(stages, columns);
  }
  let column = columns.get(key);
  if (column) columns.delete(key);
  else column = computedColumn(stages, flowAt);
  columns.set(key, column);
  if (columns.size > FREE_COLUMNS_KEPT) columns.delete(columns.keys().next().value as string);
  return column;
}

function computedColumn(stages: Float64Array, flowAt: (ws: number) => number): Float64Array {
  const column = new Float64Array(stages.length);
  for (let i = 0; i < stages.length; i++) column[i] = flowAt(stages[i]);
  return column;
}

export class OpeningsSweep {
  /** Free flow of each element at the present stage, then the rim's. */
  private readonly free: Float64Array;
  private readonly bottoms: Float64Array;
  /** Each element's kind, and its sweep's forms of the flow where `tabulated` takes them (else null). */
  private readonly kinds: AnyElementPart[];
  private readonly fast: (SweepFlow<Element> | null)[];
  private readonly rimCrest: number;
  private ws = NaN;
  /** Sum of the free flows at the present stage (m3/s). */
  freeTotal = 0;
  /** Evaluations of the openings for a downstream level (the chamber solve's cost). */
  evaluations = 0;

  constructor(readonly outlet: Outlet, tabulated: boolean) {
    const n = outlet.elements.length;
    this.free = new Float64Array(n + 1);
    this.bottoms = new Float64Array(n);
    this.kinds = outlet.elements.map(partOf);
    this.fast = this.kinds.map((k) => (tabulated ? k.sweep : null));
    outlet.elements.forEach((e, i) => {
      this.bottoms[i] = this.kinds[i].bottom(e);
    });
    this.rimCrest = outlet.riser ? outlet.riser.crest : Infinity;
  }

  /** Free flow of element i (or the rim, i = elements.length) at a stage. */
  private freeFlow(i: number, ws: number): number {
    const elements = this.outlet.elements;
    if (i === elements.length) return this.outlet.riser ? rimDischarge(this.outlet.riser, ws, -Infinity) : 0;
    const e = elements[i];
    const fast = this.fast[i];
    return fast ? fast.free(e, ws) : this.kinds[i].flow(e, ws, -Infinity);
  }

  private columns: Float64Array[] = [];
  private stages: Float64Array | null = null;
  /** After `useGrid`: each part's key (its values and how its free flow is computed) and bottom
   * (invert, crest or rim), elements then the rim. */
  partKeys: string[] = [];
  partBottoms: number[] = [];

  /** Takes every part's free flow over a stage grid from the columns kept for it (see `freeColumn`);
   * `keep` false: computed for this grid alone (a grid used once, e.g. a drain-time integral's). */
  useGrid(stages: Float64Array, keep = true): void {
    const elements = this.outlet.elements;
    this.columns = [];
    this.partKeys = [];
    this.partBottoms = [];
    for (let i = 0; i <= elements.length; i++) {
      const part = i < elements.length ? elements[i] : (this.outlet.riser ?? null);
      const how = i < elements.length && this.fast[i] ? "table" : "direct";
      const key = `${how} ${JSON.stringify(part)}`;
      this.partKeys.push(key);
      this.partBottoms.push(i < elements.length ? this.bottoms[i] : this.rimCrest);
      this.columns.push(freeColumn(stages, key, (ws) => this.freeFlow(i, ws), keep));
    }
    this.stages = stages;
  }

  /** Sets the pond stage to stage `index` of the grid given to `useGrid`. */
  setGridStage(index: number): number {
    this.ws = (this.stages as Float64Array)[index];
    const columns = this.columns;
    let total = 0;
    for (let i = 0; i < columns.length; i++) {
      const q = columns[i][index];
      this.free[i] = q;
      total += q;
    }
    this.freeTotal = total;
    return total;
  }

  /** Flow in through the openings and the rim at the present stage for a downstream level. */
  flow(ds: number): number {
    this.evaluations++;
    const ws = this.ws;
    const elements = this.outlet.elements;
    const bottoms = this.bottoms;
    const free = this.free;
    let q = 0;
    for (let i = 0; i < elements.length; i++) q += ds <= bottoms[i] ? free[i] : this.drowned(i, ws, ds);
    if (this.outlet.riser) q += ds <= this.rimCrest ? free[elements.length] : rimDischarge(this.outlet.riser, ws, ds);
    return q;
  }

  /** Flow of element i at a stage for a downstream level above its bottom. */
  private drowned(i: number, ws: number, ds: number): number {
    const e = this.outlet.elements[i];
    const fast = this.fast[i];
    return fast ? fast.drowned(e, ws, ds) : this.kinds[i].flow(e, ws, ds);
  }

  /**
   * The openings' and the rim's flow at every stage of the grid given to `useGrid` for one constant
   * downstream level (a fixed tailwater without a barrel): each part's flow at that level is a column
   * kept like its free flow (`freeColumn`, by the part's key and the level), so candidates that share
   * a part evaluate it once per grid; the sum is `flow(tw)` at each stage bit for bit (the same terms
   * added in the same order), and the free flow where that is zero (as `rateOutlet` takes it).
   */
  flowsAtLevel(tw: number, out: Float64Array, keep = true): void {
    const stages = this.stages as Float64Array;
    const elements = this.outlet.elements;
    const riser = this.outlet.riser;
    const columns: Float64Array[] = [];
    for (let i = 0; i < elements.length; i++) {
      if (tw <= this.bottoms[i]) columns.push(this.columns[i]);
      else columns.push(freeColumn(stages, `at ${tw} ${this.partKeys[i]}`, (ws) => this.drowned(i, ws, tw), keep));
    }
    const rim = !riser ? null : tw <= this.rimCrest ? this.columns[elements.length] : freeColumn(stages, `at ${tw} ${this.partKeys[elements.length]}`, (ws) => rimDischarge(riser, ws, tw), keep);
    for (let k = 0; k < stages.length; k++) {
      const free = this.setGridStage(k);
      if (!(free > 0)) {
        out[k] = free;
        continue;
      }
      let q = 0;
      for (let i = 0; i < columns.length; i++) q += columns[i][k];
      if (rim) q += rim[k];
      out[k] = q;
    }
  }
}
