// Critical depth in a barrel: the depth at which Q^2/g = A^3/T (A flow area, T top width), the
// condition of minimum specific energy (Chow 1959, Open-Channel Hydraulics, sec. 3-2; HDS-5 ch. III).
// Solved, not read from a chart: closed form for a rectangle, Newton's method with a bisection
// safeguard for a circle. SI units.
import type { Barrel } from "../model.js";
import { GRAVITY } from "../units.js";

/** Critical depth of a rectangular section of width `span` (m): dc = (q^2/g)^(1/3), q = Q/span. */
export function boxCriticalDepth(flow: number, span: number): number {
  if (!(flow > 0)) return 0;
  const q = flow / span;
  return Math.cbrt((q * q) / GRAVITY);
}

/** theta - sin(theta) without cancellation at small angles (Taylor series below 0.01 rad). */
export function thetaMinusSine(theta: number): number {
  if (theta < 0.01) {
    const t2 = theta * theta;
    return theta * t2 * (1 / 6 - t2 * (1 / 120 - t2 / 5040));
  }
  return theta - Math.sin(theta);
}

/** Flow area of a circle of diameter d filled to the central angle theta (radians). */
function segmentAreaByAngle(d: number, theta: number): number {
  return (d * d * thetaMinusSine(theta)) / 8;
}

/**
 * Central angle theta of the water surface in a circular barrel at critical flow. The depth is
 * y = (d/2)(1 - cos(theta/2)), A = d^2 (theta - sin theta)/8, T = d sin(theta/2), and
 * G(theta) = 3 ln A - ln T - ln(Q^2/g) rises monotonically from -inf (theta -> 0) to +inf
 * (theta -> 2 pi), so the root is unique.
 */
function circularCriticalAngle(flow: number, d: number): number {
  // In logarithms throughout, so that no square of a tiny flow underflows.
  const target = 2 * Math.log(flow) - Math.log(GRAVITY);
  // Small-angle start: A ~ d^2 theta^3 / 48, T ~ d theta / 2, so A^3/T ~ d^5 theta^8 / 55296.
  let theta = Math.exp((Math.log(55296) + target - 5 * Math.log(d)) / 8);
  let low = 0;
  let high = 2 * Math.PI;
  if (!(theta > low && theta < high)) theta = Math.PI;
  for (let iteration = 0; iteration < 100; iteration++) {
    const area = segmentAreaByAngle(d, theta);
    const half = 0.5 * theta;
    const top = d * Math.sin(half);
    const g = 3 * Math.log(area) - Math.log(top) - target;
    if (g === 0) return theta;
    if (g > 0) high = theta;
    else low = theta;
    const slope = (3 * (d * d * (1 - Math.cos(theta)))) / 8 / area - (0.5 * d * Math.cos(half)) / top;
    let next = theta - g / slope;
    if (!(next >= low && next <= high)) next = 0.5 * (low + high);
    if (Math.abs(next - theta) <= 1e-13 * theta || high - low <= 1e-13 * theta) return next;
    theta = next;
  }
  return theta;
}

/** Critical depth in a circular barrel of diameter d (m); always below d. */
export function circularCriticalDepth(flow: number, d: number): number {
  if (!(flow > 0)) return 0;
  const s = Math.sin(0.25 * circularCriticalAngle(flow, d));
  return d * s * s;
}

/** Central angle of the water surface in a circle of diameter d flowing y deep (y = d sin^2(theta/4)). */
export function angleAtDepth(d: number, y: number): number {
  const ratio = Math.min(Math.max(y / d, 0), 1);
  return 4 * Math.asin(Math.sqrt(ratio));
}

/** Flow area of a circular barrel of diameter d flowing y deep. */
export function circularFlowArea(d: number, y: number): number {
  return segmentAreaByAngle(d, angleAtDepth(d, y));
}

/** Top width of the water surface in a circular barrel of diameter d flowing y deep. */
export function circularTopWidth(d: number, y: number): number {
  return d * Math.sin(0.5 * angleAtDepth(d, y));
}

/** Critical depth (m) of a flow in a barrel, no more than its rise. */
export function barrelCriticalDepth(b: Barrel, flow: number): number {
  if (b.shape === "circular") return Math.min(circularCriticalDepth(flow, b.diameter), b.diameter);
  return Math.min(boxCriticalDepth(flow, b.span), b.rise);
}
