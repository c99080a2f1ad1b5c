// The flow of a link between two ponds (hydraulics/link.ts) as a two-dimensional rating, built once per
// link, which the system router interpolates at every iteration.
//
// Two tables, by how close the two stages are:
//   - over the two stages (h_up, h_down), where they differ by at least `band`: bilinear between the
//     nodes of two stage axes, each holding every elevation where a part of the link starts or stops
//     acting (inverts, opening tops, crests, the rim, the spillway crest, the barrel's inverts and
//     crowns), graded geometrically above those where a flow starts as a power of the head, as the
//     single pond's stage grid is; so every kink in either stage lies on a node line;
//   - over (h_up, dh = h_up - h_down) within the band: where the levels are close the flow goes like a
//     power of their difference below 1 (a drowned orifice or barrel as its square root, a drowned
//     weir as Villemonte's (1 - r^n)^0.385, i.e. the difference to the power 0.385), steepest where it
//     changes sign. A table over the two stages would cut that line (h_up = h_down) across its cells
//     and flatten the power into a straight line; here it is the node line dh = 0, and the nodes of dh
//     are graded geometrically away from it (from DIFFERENCE_SMALLEST at the ratio DIFFERENCE_RATIO),
//     so linear interpolation follows the power within a fraction of a per cent.
// The band is a few of the stage axes' widest intervals, so that no cell of the first table used at a
// difference of `band` or more reaches the line of equal levels.
//
// Every node is rated by `LinkEvaluator` (the barrel's headwater tabulated over flow and tailwater,
// barrelSurface.ts); accuracy against the direct evaluation (`linkFlow`, barrels by their pointwise
// HDS-5 forms): tests/routing/linkTable.test.ts.
import type { Outlet, Pond } from "../model.js";
import { bottomOf, partOf } from "../parts/registry.js";
import { barrelRise } from "../parts/barrel.js";
import { LinkEvaluator } from "../hydraulics/link.js";
import { storageBreaks } from "../storage/curve.js";

/**
 * Level difference (m) over which the system router takes a link's flow as a chord for its time
 * constant, so that levels at rest against each other do not shrink the step to nothing.
 */
export const CHORD_DIFFERENCE = 0.002;

/** Uniform intervals of each stage axis over its pond's depth. */
export const LINK_INTERVALS = 100;
/** Grading above each onset on the stage axes: ratio of neighbouring intervals, first interval as a fraction of the uniform step. */
const AXIS_GRADING_RATIO = 1.4;
const AXIS_GRADING_SMALLEST = 1 / 16;
/** The band, in the widest interval of either stage axis. */
const BAND_INTERVALS = 2.5;
/** The difference axis: first node either side of zero (m) and the ratio of neighbouring intervals. */
const DIFFERENCE_SMALLEST = 1e-5;
const DIFFERENCE_RATIO = 1.5;

/** Elevations where one of the link's parts starts or stops acting, for either pond's level: [where a flow starts as a power of the head, other kinks]. */
export function linkBreaks(outlet: Outlet): { onsets: number[]; kinks: number[] } {
  const kinks: number[] = [];
  const onsets: number[] = [];
  for (const e of outlet.elements) {
    partOf(e).breaks(e, kinks);
    onsets.push(bottomOf(e));
  }
  if (outlet.riser) onsets.push(outlet.riser.crest);
  if (outlet.spillway) onsets.push(outlet.spillway.crest);
  const b = outlet.barrel;
  if (b) {
    const rise = barrelRise(b);
    onsets.push(b.inletInvert, b.outletInvert);
    kinks.push(b.inletInvert + rise, b.outletInvert + rise);
  }
  return { onsets, kinks };
}

/** A pond's stage axis: uniform from the floor to the top plus half the depth, the link's elevations inserted, graded above its onsets. */
export function linkAxis(pond: Pond, breaks: { onsets: readonly number[]; kinks: readonly number[] }, intervals = LINK_INTERVALS): Float64Array {
  const depth = pond.top - pond.bottom;
  const h = depth / intervals;
  const end = pond.top + 0.5 * depth;
  const points: number[] = [];
  for (let i = 0; i < intervals * 1.5; i++) points.push(pond.bottom + i * h);
  points.push(end);
  const inside = (z: number) => z > pond.bottom && z < end;
  const span = (h * AXIS_GRADING_RATIO) / (AXIS_GRADING_RATIO - 1);
  for (const z of [...breaks.kinks, ...breaks.onsets, pond.pool, pond.top, ...storageBreaks(pond)]) if (inside(z)) points.push(z);
  for (const b of breaks.onsets) {
    if (!(b >= pond.bottom && b < end)) continue;
    for (let g = h * AXIS_GRADING_SMALLEST; g < span; g *= AXIS_GRADING_RATIO) if (inside(b + g)) points.push(b + g);
  }
  return uniqueSorted(points, 1e-7 * h);
}

/** The difference axis over [-band, band]: zero, then graded geometrically away from it. */
export function differenceAxis(band: number): Float64Array {
  const points = [0, band, -band];
  for (let d = DIFFERENCE_SMALLEST, step = DIFFERENCE_SMALLEST; d < band; step *= DIFFERENCE_RATIO, d += step) points.push(d, -d);
  return uniqueSorted(points, 1e-12);
}

function uniqueSorted(points: number[], tolerance: number): Float64Array {
  points.sort((a, b) => a - b);
  const unique: number[] = [];
  for (const p of points) if (unique.length === 0 || p - unique[unique.length - 1] > tolerance) unique.push(p);
  return Float64Array.from(unique);
}

/** The widest interval of an axis. */
function widest(axis: Float64Array): number {
  let w = 0;
  for (let i = 1; i < axis.length; i++) w = Math.max(w, axis[i] - axis[i - 1]);
  return w;
}

/**
 * The tabulated link: `flow(up, down)` gives the flow and sets its partial derivatives (those of the
 * bilinear interpolant). Cursors are kept between calls (a router's stages move little from one call
 * to the next), so a look-up walks a cell or two; nothing is allocated per call.
 */
export class LinkTable {
  /** Largest |flow| at any node (m3/s). */
  readonly largestFlow: number;
  /** Partial derivatives of the last `flow` in the upstream and downstream stage (m2/s). */
  dUp = 0;
  dDown = 0;
  /** The last look-up fell outside the table (extrapolated). */
  beyond = false;
  /**
   * The cell of the last look-up (a number that differs between any two cells of either table): two
   * look-ups in the same cell are on one bilinear piece (the system router's test of convergence).
   */
  cell = 0;
  /** The two tables as the look-up walks them (each keeps its own cursors). */
  private readonly grid: Plane;
  private readonly closeLevels: Plane;

  constructor(
    readonly outlet: Outlet,
    /** Upstream and downstream stage axes (m). */
    readonly up: Float64Array,
    readonly down: Float64Array,
    /** Flow at each node of the stages table (m3/s, positive forward), [i * down.length + j]. */
    readonly gridFlow: Float64Array,
    /** Half-width of the band of close levels (m). */
    readonly band: number,
    /** Differences upstream less downstream stage (m) of the band's table, -band to band. */
    readonly difference: Float64Array,
    /** Flow at each node of the band's table, [i * difference.length + k]. */
    readonly bandFlow: Float64Array,
  ) {
    let largest = 0;
    for (const q of gridFlow) if (Math.abs(q) > largest) largest = Math.abs(q);
    this.largestFlow = largest;
    const inverse = (axis: Float64Array) => Float64Array.from({ length: axis.length - 1 }, (_, k) => 1 / (axis[k + 1] - axis[k]));
    this.upInverse = inverse(up);
    this.grid = new Plane(false, down, inverse(down), gridFlow);
    this.closeLevels = new Plane(true, difference, inverse(difference), bandFlow);
  }

  /** Flow (m3/s, positive from the upstream pond into the downstream one) at two stages; sets `dUp`, `dDown`. */
  flow(x: number, y: number): number {
    this.lookup(x, y);
    return this.q;
  }

  /** The flow of the last look-up (m3/s): the router reads it here, so that no number is boxed per call. */
  q = 0;
  private readonly pair = new Float64Array(2);
  /** 1 / the width of each interval of the upstream stage axis. */
  private readonly upInverse: Float64Array;

  /** Sets `q`, `dUp`, `dDown`, `cell` and `beyond` at two stages. */
  lookup(x: number, y: number): void {
    this.pair[0] = x;
    this.pair[1] = y;
    this.lookupIn(this.pair, 0, 1);
  }

  /** `lookup` with the downstream stage x[down] and the upstream one CHORD_DIFFERENCE above it (the router's chord near equal levels). */
  lookupChord(x: Float64Array, down: number): void {
    this.pair[0] = x[down] + CHORD_DIFFERENCE;
    this.pair[1] = x[down];
    this.lookupIn(this.pair, 0, 1);
  }

  /**
   * `lookup` at the stages x[up] and x[down]. The router passes its state array and two indices, and
   * the pieces of the look-up (`Plane.locate`, `Plane.interpolate`) take arrays and indices and leave
   * their results in fields, so that no number is boxed on the way in or out; each piece is small
   * enough for V8 to inline it into the router's pass (a method of more than 460 bytes of bytecode it
   * does not inline, and a call there costs the pass its loaded arrays).
   */
  lookupIn(x: Float64Array, upAt: number, downAt: number): void {
    // Within the band the table is over (upstream stage, difference), else over the two stages.
    const d = x[upAt] - x[downAt];
    const inBand = d < this.band && d > -this.band;
    const plane = inBand ? this.closeLevels : this.grid;
    plane.locate(this.up, this.upInverse, x, upAt, downAt);
    plane.interpolate(this.upInverse);
    this.q = plane.q;
    this.beyond = plane.beyond;
    // Q(x, d) with d = x - y: dQ/dx at a fixed downstream stage is dQ/dx + dQ/dd; dQ/dy is -dQ/dd.
    this.dUp = inBand ? plane.byX + plane.byY : plane.byX;
    this.dDown = inBand ? -plane.byY : plane.byY;
    this.cell = inBand ? -1 - plane.at : plane.at;
  }
}

/**
 * One of a link's two tables as the look-up walks it: its second axis (the downstream stage, or the
 * difference of the levels), 1 / the width of each of its intervals, the flow at its nodes (rows by
 * the upstream stage), and the cells of the last look-up in it.
 */
class Plane {
  /** The cells [i, i + 1] and [j, j + 1] of the last look-up (the first or last beyond the ends), walked from there. */
  i = 0;
  j = 0;
  /** The last look-up: where it fell in its cell (0 to 1 along each axis), the first node's index, whether it fell outside the table. */
  u = 0;
  v = 0;
  at = 0;
  beyond = false;
  /** Its flow and partial derivatives in the upstream stage and the second coordinate. */
  q = 0;
  byX = 0;
  byY = 0;
  constructor(
    /** Whether the second axis is the difference of the levels (the band's table). */
    readonly difference: boolean,
    readonly axis: Float64Array,
    readonly inverse: Float64Array,
    readonly flow: Float64Array,
  ) {}

  /** Walks the cursors to the cells holding the upstream stage x[upAt] and the second coordinate (from x[downAt]). */
  locate(up: Float64Array, upInverse: Float64Array, x: Float64Array, upAt: number, downAt: number): void {
    const xu = x[upAt];
    const y = this.difference ? xu - x[downAt] : x[downAt];
    const lastUp = up.length - 2;
    let i = this.i;
    while (i < lastUp && xu > up[i + 1]) i++;
    while (i > 0 && xu < up[i]) i--;
    const other = this.axis;
    const lastOther = other.length - 2;
    let j = this.j;
    while (j < lastOther && y > other[j + 1]) j++;
    while (j > 0 && y < other[j]) j--;
    this.i = i;
    this.j = j;
    this.at = i * other.length + j;
    const u = (xu - up[i]) * upInverse[i];
    const v = (y - other[j]) * this.inverse[j];
    this.u = u;
    this.v = v;
    this.beyond = u > 1 || v > 1 || u < 0 || v < 0;
  }

  /** Bilinear interpolation in the cell `locate` found: `q`, `byX`, `byY`. */
  interpolate(upInverse: Float64Array): void {
    const { u, v, at, flow } = this;
    const stride = this.axis.length;
    const q00 = flow[at];
    const q01 = flow[at + 1];
    const q10 = flow[at + stride];
    const q11 = flow[at + stride + 1];
    const qx0 = q00 + u * (q10 - q00);
    const qx1 = q01 + u * (q11 - q01);
    this.byX = ((1 - v) * (q10 - q00) + v * (q11 - q01)) * upInverse[this.i];
    this.byY = (qx1 - qx0) * this.inverse[this.j];
    this.q = qx0 + v * (qx1 - qx0);
  }
}

/** Rates a pond's outlet into another pond over both ponds' stages (see the file's head). */
export function buildLinkTable(outlet: Outlet, upPond: Pond, downPond: Pond, intervals = LINK_INTERVALS): LinkTable {
  const breaks = linkBreaks(outlet);
  const up = linkAxis(upPond, breaks, intervals);
  const down = linkAxis(downPond, breaks, intervals);
  const nu = up.length;
  const nd = down.length;
  const band = BAND_INTERVALS * Math.max(widest(up), widest(down));
  const link = new LinkEvaluator(outlet, Math.max(up[nu - 1], down[nd - 1]) + band);
  const grid = new Float64Array(nu * nd);
  for (let i = 0; i < nu; i++) for (let j = 0; j < nd; j++) grid[i * nd + j] = link.flow(up[i], down[j]);
  const difference = differenceAxis(band);
  const nk = difference.length;
  const bandFlow = new Float64Array(nu * nk);
  for (let i = 0; i < nu; i++) for (let k = 0; k < nk; k++) bandFlow[i * nk + k] = link.flow(up[i], up[i] - difference[k]);
  return new LinkTable(outlet, up, down, grid, band, difference, bandFlow);
}
