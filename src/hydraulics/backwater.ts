// The water-surface profile of part-full flow in a barrel, computed from the outlet upstream:
// gradually varied flow, dy/dx = (S0 - Sf) / (1 - Fr^2) with Manning's friction slope
// Sf = n^2 Q^2 / (A^2 R^(4/3)) and Fr^2 = Q^2 T / (g A^3) of the part-full section (Chow 1959,
// Open-Channel Hydraulics, eq 9-13 and ch. 10). The profile is subcritical: it starts at the outlet
// from max(tailwater depth, critical depth) and runs upstream until it reaches the inlet, fills the
// barrel to its crown, or falls to critical depth (on a steep barrel: the hydraulic jump is then in
// the barrel and the supercritical flow from the inlet is not drowned).
//
// Method: the direct-step method in its integral form (Chow 1959, sec. 10-2 and 10-3): the distance
// upstream over which the depth changes from y0 to y is the integral of
// dxi/dy = (1 - Fr^2) / (Sf - S0) over depth, accumulated by adaptive Simpson steps until it reaches
// the barrel length, and the depth there is found inside the last step. The integral is taken in a
// variable that keeps the integrand smooth: s = -ln|y - yn| while the profile approaches normal depth
// yn (the distance grows like ln|y - yn| there), the depth itself otherwise. Near critical depth
// dy/dx is unbounded but dxi/dy goes smoothly to zero, so a profile may start at critical depth.
//
// Profile types (Chow 1959, sec. 9-3): mild slope (yn > yc) M2 below normal depth, M1 above it;
// steep slope (yn < yc) S1 from a tailwater above critical depth; horizontal H2 and adverse A2
// rise upstream until they reach the crown (no normal depth). SI units.
import type { Barrel } from "../model.js";
import { barrelSlope, emptySection, frictionSlope, froudeSquared, sectionAt } from "./barrelSection.js";
import { barrelRise } from "../parts/barrel.js";
import { normalDepth } from "./normalDepth.js";
import { barrelCriticalDepth } from "./criticalDepth.js";

/** Where a profile stops: at the inlet, at the crown (the barrel runs full upstream of that point),
 * or at critical depth (a hydraulic jump in the barrel). */
export type ProfileEnd = "inlet" | "crown" | "critical";

export type ProfileKind = "M1" | "M2" | "S1" | "H2" | "A2" | "uniform" | "full at outlet" | "supercritical at outlet";

export interface Profile {
  kind: ProfileKind;
  end: ProfileEnd;
  /** Depth (m) at the end: the inlet depth, the rise at the crown, critical depth at a jump. */
  depth: number;
  /** Distance upstream of the outlet (m) at which the profile ends; the barrel length at the inlet. */
  distance: number;
  /** Accepted integration steps. */
  steps: number;
  /** The step limit stopped the integration short of the inlet; `depth` is the last depth reached. */
  limited: boolean;
  /** Normal and critical depth of the flow (m); normal depth is Infinity when there is none. */
  normalDepth: number;
  criticalDepth: number;
}

/** Most accepted steps one profile may take (an ordinary profile takes 5 to 30). */
export const PROFILE_MAX_STEPS = 400;
/** Error allowed per step in the distance integral, as a fraction of the barrel length. */
export const PROFILE_TOLERANCE = 1e-8;
/** Closer than this fraction of the rise to normal depth, the rest of the barrel is at normal depth. */
const NORMAL_DEPTH_REACHED = 1e-11;

const section = emptySection();

/** dxi/dy = (1 - Fr^2) / (Sf - S0): distance upstream per unit change of depth. */
function distancePerDepth(b: Barrel, flow: number, slope: number, depth: number): number {
  sectionAt(b, depth, section);
  return (1 - froudeSquared(section, flow)) / (frictionSlope(section, flow, b.manningN) - slope);
}

/**
 * The subcritical profile of `flow` (m3/s, > 0) from the outlet, where the water is `outletDepth`
 * deep above the outlet invert (raised to critical depth if below it), upstream to the inlet, in
 * at most `maxSteps` accepted steps.
 */
export function backwaterProfile(b: Barrel, flow: number, outletDepth: number, maxSteps = PROFILE_MAX_STEPS): Profile {
  const rise = barrelRise(b);
  const length = b.length;
  const slope = barrelSlope(b);
  const yc = barrelCriticalDepth(b, flow);
  const yn = normalDepth(b, flow);
  const y0 = Math.max(outletDepth, yc);
  const result = (kind: ProfileKind, end: ProfileEnd, depth: number, distance: number, steps = 0, limited = false): Profile => ({
    kind, end, depth, distance, steps, limited, normalDepth: yn, criticalDepth: yc,
  });
  if (y0 >= rise) return result("full at outlet", "crown", rise, 0);
  const steep = yn < yc;
  if (steep && y0 <= yc) return result("supercritical at outlet", "critical", yc, 0);
  if (y0 === yn) return result("uniform", "inlet", yn, length);

  const f = (y: number) => distancePerDepth(b, flow, slope, y);
  if (steep) {
    // S1: the depth falls upstream towards critical depth.
    const m = march((s) => -f(y0 - s), y0 - yc, length, 0.125 * (y0 - yc), 1e-12 * rise, maxSteps);
    return result("S1", m.reached ? "inlet" : "critical", m.reached ? y0 - m.s : yc, m.distance, m.steps, m.limited);
  }
  // A normal depth far above the crown (a box on a nearly flat slope) would only cost precision in
  // the logarithmic variable; the profile then rises to the crown as on a horizontal barrel.
  if (yn <= 2 * rise) {
    // M1 or M2: the depth approaches normal depth upstream; s = -ln(|y - yn| / |y0 - yn|).
    const gap = y0 - yn;
    const depthAt = (s: number) => yn + gap * Math.exp(-s);
    const toCrown = yn > rise ? Math.log((yn - y0) / (yn - rise)) : Infinity;
    const toNormal = Math.log(Math.abs(gap) / (NORMAL_DEPTH_REACHED * rise));
    const end = Math.min(toCrown, Math.max(toNormal, 0));
    const m = march((s) => { const y = depthAt(s); return f(y) * (yn - y); }, end, length, 0.5, 1e-9, maxSteps);
    const kind: ProfileKind = gap < 0 ? "M2" : "M1";
    if (m.reached) return result(kind, "inlet", depthAt(m.s), length, m.steps, m.limited);
    if (end === toCrown) return result(kind, "crown", rise, m.distance, m.steps, m.limited);
    return result(kind, "inlet", m.limited ? depthAt(m.s) : yn, length, m.steps, m.limited);
  }
  // H2, A2, a circle asked for more than its largest part-full flow, or a normal depth far above
  // the crown: the depth rises to the crown.
  const kind: ProfileKind = slope < 0 ? "A2" : slope === 0 ? "H2" : "M2";
  const m = march((s) => f(y0 + s), rise - y0, length, 0.125 * (rise - y0), 1e-12 * rise, maxSteps);
  return result(kind, m.reached ? "inlet" : "crown", m.reached ? y0 + m.s : rise, m.distance, m.steps, m.limited);
}

interface March {
  /** The barrel length was reached at s (inside the interval). */
  reached: boolean;
  s: number;
  /** Distance covered (the barrel length when reached). */
  distance: number;
  steps: number;
  limited: boolean;
}

/**
 * Integrates g(s) >= 0 from s = 0 by adaptive Simpson steps (error estimated by comparing one and
 * two Simpson panels; each step keeps the Richardson-extrapolated, Boole's-rule value) until the
 * integral reaches `length` or s reaches `end`. Where the integral crosses `length` inside a step,
 * s is found on the quartic through the step's five samples (Newton's method on its integral).
 */
function march(g: (s: number) => number, end: number, length: number, firstStep: number, smallestStep: number, maxSteps: number): March {
  const tolerance = PROFILE_TOLERANCE * length;
  let s = 0;
  let distance = 0;
  let g0 = g(0);
  let h = Math.min(firstStep, end);
  let steps = 0;
  let reuse = false;
  let g2 = 0;
  let g4 = 0;
  while (steps < maxSteps) {
    const last = s + h >= end;
    if (last) h = end - s;
    if (!reuse) {
      g2 = g(s + 0.5 * h);
      g4 = g(s + h);
    }
    reuse = false;
    const g1 = g(s + 0.25 * h);
    const g3 = g(s + 0.75 * h);
    const coarse = (h / 6) * (g0 + 4 * g2 + g4);
    const fine = (h / 12) * (g0 + 4 * g1 + 2 * g2 + 4 * g3 + g4);
    const error = Math.abs(fine - coarse) / 15;
    if (!(error <= tolerance) && h > smallestStep) {
      // Halve the step: its quarter points become the half step's midpoint and end.
      h *= 0.5;
      g4 = g2;
      g2 = g1;
      reuse = true;
      continue;
    }
    const piece = fine + (fine - coarse) / 15;
    if (distance + piece >= length) {
      const u = locate(g0, g1, g2, g3, g4, (length - distance) / h);
      return { reached: true, s: s + u * h, distance: length, steps: steps + 1, limited: false };
    }
    distance += piece;
    s += h;
    g0 = g4;
    steps++;
    if (last) return { reached: false, s, distance, steps, limited: false };
    const grow = error > 0 ? 0.9 * Math.pow(tolerance / error, 0.2) : 4;
    h *= Math.min(4, Math.max(0.25, grow));
  }
  return { reached: false, s, distance, steps, limited: true };
}

/** Gauss-Legendre 3-point abscissae on [0, 1] and weights: exact for the integral of a quartic. */
const GAUSS_X = [0.5 - 0.5 * Math.sqrt(0.6), 0.5, 0.5 + 0.5 * Math.sqrt(0.6)];
const GAUSS_W = [5 / 18, 8 / 18, 5 / 18];

/**
 * u in [0, 1] at which the integral from 0 to u of the quartic p through (k/4, g_k), k = 0..4,
 * equals `target` (in units of the step). Newton's method with a bisection safeguard.
 */
function locate(g0: number, g1: number, g2: number, g3: number, g4: number, target: number): number {
  // Newton forward differences with step 1/4: p(u) = sum_k D^k g0 C(4u, k).
  const d1 = g1 - g0;
  const d2 = g2 - 2 * g1 + g0;
  const d3 = g3 - 3 * g2 + 3 * g1 - g0;
  const d4 = g4 - 4 * g3 + 6 * g2 - 4 * g1 + g0;
  const p = (u: number) => {
    const z = 4 * u;
    return g0 + z * (d1 + ((z - 1) / 2) * (d2 + ((z - 2) / 3) * (d3 + ((z - 3) / 4) * d4)));
  };
  const integral = (u: number) => u * (GAUSS_W[0] * p(u * GAUSS_X[0]) + GAUSS_W[1] * p(u * GAUSS_X[1]) + GAUSS_W[2] * p(u * GAUSS_X[2]));
  let low = 0;
  let high = 1;
  const total = integral(1);
  let u = total > 0 ? Math.min(Math.max(target / total, 0), 1) : 0.5;
  for (let iteration = 0; iteration < 60; iteration++) {
    const excess = integral(u) - target;
    if (excess > 0) high = u;
    else low = u;
    const slope = p(u);
    let next = slope > 0 ? u - excess / slope : 0.5 * (low + high);
    if (!(next > low && next < high)) next = 0.5 * (low + high);
    if (Math.abs(next - u) <= 1e-13) return next;
    u = next;
  }
  return u;
}
