// Normal (uniform-flow) depth in a barrel by Manning's equation, SI: Q = (1/n) A R^(2/3) S^(1/2)
// (Chow 1959, Open-Channel Hydraulics, eq 6-1 and sec. 6-4). The section factor A R^(2/3) of a
// circle rises to a maximum at about 0.938 D and falls after it (the crown's perimeter grows
// faster than its area), so a circle carries at most about 1.076 times its full-flow capacity at
// normal depth (Chow 1959, Fig. 6-3; from memory) and a larger flow has no normal depth in it. A
// box flowing part full has the section factor of an open rectangle, which rises without bound.
import type { Barrel } from "../model.js";
import { GRAVITY } from "../units.js";
import { barrelSlope, emptySection, sectionAt, type Section } from "./barrelSection.js";
import { brentRoot } from "./roots.js";
import { thetaMinusSine } from "./criticalDepth.js";

/** ln of a circle's section factor A R^(2/3) = A^(5/3) / P^(2/3) at the central angle theta. */
function circleLogFactor(d: number, theta: number): number {
  const area = (d * d * thetaMinusSine(theta)) / 8;
  const perimeter = 0.5 * d * theta;
  return (5 / 3) * Math.log(area) - (2 / 3) * Math.log(perimeter);
}

/** Its derivative in theta: (5/3) A'/A - (2/3) P'/P with A' = d^2 (1 - cos theta)/8, P' = d/2. */
function circleLogFactorSlope(theta: number): number {
  return (5 / 3) * ((1 - Math.cos(theta)) / thetaMinusSine(theta)) - (2 / 3) / theta;
}

/**
 * Central angle at which a circle's section factor is largest: the root of
 * 5 (1 - cos theta) theta = 2 (theta - sin theta) between pi and 2 pi (solved once, by bisection).
 */
export const CIRCLE_MAX_FACTOR_ANGLE = (() => {
  let low = Math.PI;
  let high = 2 * Math.PI;
  for (let i = 0; i < 200 && high - low > 1e-15; i++) {
    const mid = 0.5 * (low + high);
    if (5 * mid * (1 - Math.cos(mid)) - 2 * (mid - Math.sin(mid)) > 0) low = mid;
    else high = mid;
  }
  return 0.5 * (low + high);
})();

/** Depth ratio y/D at which a circle's section factor is largest (about 0.938). */
export const CIRCLE_MAX_FACTOR_DEPTH_RATIO = Math.sin(0.25 * CIRCLE_MAX_FACTOR_ANGLE) ** 2;

/** Flow (m3/s) at normal depth `depth` in a barrel on slope `slope` (> 0) by Manning's equation. */
export function manningFlow(b: Barrel, depth: number, slope: number): number {
  let logFactor: number;
  if (b.shape === "circular") {
    const ratio = Math.min(Math.max(depth / b.diameter, 0), 1);
    logFactor = circleLogFactor(b.diameter, 4 * Math.asin(Math.sqrt(ratio)));
  } else {
    logFactor = (5 / 3) * Math.log(b.span * depth) - (2 / 3) * Math.log(b.span + 2 * depth);
  }
  return (Math.exp(logFactor) * Math.sqrt(slope)) / b.manningN;
}

/**
 * Normal depth (m) of a flow in a barrel: the depth at which Manning's friction slope equals the
 * barrel's slope. Infinity when there is none: a horizontal or adverse barrel, or a circle asked
 * for more than its largest part-full flow. For a box the open-rectangle depth is returned even
 * when it exceeds the rise (the profile then reaches the crown before it gets there).
 */
export function normalDepth(b: Barrel, flow: number): number {
  const slope = barrelSlope(b);
  if (!(flow > 0)) return 0;
  if (!(slope > 0)) return Infinity;
  const target = Math.log((b.manningN * flow) / Math.sqrt(slope));
  return b.shape === "circular" ? circleNormalDepth(b.diameter, target) : boxNormalDepth(b.span, target);
}

/** Newton's method in ln(section factor) with a bisection safeguard on [0, largest-factor angle]. */
function circleNormalDepth(d: number, target: number): number {
  const top = CIRCLE_MAX_FACTOR_ANGLE;
  if (target > circleLogFactor(d, top)) return Infinity;
  // Small angles: A ~ d^2 theta^3/48, P = d theta/2, so A^(5/3)/P^(2/3) ~ d^(8/3) theta^(13/3) 48^(-5/3) 2^(2/3).
  const smallAngleLog = (5 / 3) * Math.log(1 / 48) + (2 / 3) * Math.log(2) + (8 / 3) * Math.log(d);
  let theta = Math.exp((3 / 13) * (target - smallAngleLog));
  let low = 0;
  let high = top;
  if (!(theta > low && theta < high)) theta = 0.5 * top;
  for (let iteration = 0; iteration < 100; iteration++) {
    const g = circleLogFactor(d, theta) - target;
    if (g === 0) break;
    if (g > 0) high = theta;
    else low = theta;
    let next = theta - g / circleLogFactorSlope(theta);
    if (!(next > low && next < high)) next = 0.5 * (low + high);
    const done = Math.abs(next - theta) <= 1e-14 * theta || high - low <= 1e-14 * theta;
    theta = next;
    if (done) break;
  }
  const s = Math.sin(0.25 * theta);
  return d * s * s;
}

/** Newton's method in ln(section factor) of an open rectangle, ln(B y)^(5/3) - ln(B + 2y)^(2/3), which rises with y. */
function boxNormalDepth(span: number, target: number): number {
  // Start from the wide-channel depth (n Q / (B S^0.5))^(3/5) and Newton on y (converges from above or below).
  let y = Math.exp(0.6 * (target - Math.log(span)));
  for (let iteration = 0; iteration < 100; iteration++) {
    const g = (5 / 3) * Math.log(span * y) - (2 / 3) * Math.log(span + 2 * y) - target;
    const slope = 5 / (3 * y) - 4 / (3 * (span + 2 * y));
    let next = y - g / slope;
    if (!(next > 0)) next = 0.5 * y;
    if (Math.abs(next - y) <= 1e-14 * y) return next;
    y = next;
  }
  return y;
}

/** ln of the critical slope at depth y, Sc = n^2 g A / (T R^(4/3)) (SI): the slope on which a flow that
 * is critical at y (Q^2 = g A^3/T) has y for its normal depth too (Chow 1959, sec. 7-2). */
function logCriticalSlope(b: Barrel, depth: number, s: Section): number {
  sectionAt(b, depth, s);
  const r = s.area / s.perimeter;
  return Math.log((b.manningN * b.manningN * GRAVITY * s.area) / (s.topWidth * r * Math.cbrt(r)));
}

/**
 * Flows (m3/s), ascending, at which the barrel's slope is critical (normal depth = critical depth):
 * where it turns from mild to steep or back. The critical slope of a circle or box is large at
 * small depths and again towards the crown, so a barrel can be steep over a middle band of flows
 * only; there are none, or two.
 */
export function criticalSlopeFlows(b: Barrel): number[] {
  const slope = barrelSlope(b);
  if (!(slope > 0)) return [];
  const rise = b.shape === "circular" ? b.diameter : b.rise;
  const s = emptySection();
  const target = Math.log(slope);
  const excess = (y: number) => logCriticalSlope(b, y, s) - target;
  const points = 64;
  const depthAt = (k: number) => rise * Math.pow(1e-6, 1 - k / points) * (k === points ? 0.999 : 1);
  const flows: number[] = [];
  let y0 = depthAt(0);
  let e0 = excess(y0);
  for (let k = 1; k <= points; k++) {
    const y1 = depthAt(k);
    const e1 = excess(y1);
    if (e0 > 0 !== e1 > 0) {
      const y = brentRoot(excess, y0, y1, e0, e1, 1e-12 * rise);
      sectionAt(b, y, s);
      flows.push(Math.sqrt((GRAVITY * s.area * s.area * s.area) / s.topWidth));
    }
    y0 = y1;
    e0 = e1;
  }
  return flows;
}
