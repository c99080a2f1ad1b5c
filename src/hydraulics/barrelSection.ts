// The barrel's cross-section flowing part full: flow area A, top width T and wetted perimeter P at
// a depth y, exactly (no chart). A circle of diameter D filled to the central angle
// theta = 4 asin(sqrt(y/D)) has A = D^2 (theta - sin theta)/8, P = D theta/2, T = D sin(theta/2)
// (Chow 1959, Open-Channel Hydraulics, Table 2-1). A box of span B has A = B y, P = B + 2 y, T = B
// up to its rise (the lid is not wetted until the box runs full). SI units. Rise, full area and
// full hydraulic radius are the barrel part's (src/parts/barrel.ts).
import type { Barrel } from "../model.js";
import { GRAVITY } from "../units.js";
import { thetaMinusSine } from "./criticalDepth.js";

/** Barrel slope S = (inlet invert - outlet invert) / length. */
export function barrelSlope(b: Barrel): number {
  return (b.inletInvert - b.outletInvert) / b.length;
}

/** Area, top width and wetted perimeter at one depth; filled in place to spare allocation. */
export interface Section {
  area: number;
  topWidth: number;
  perimeter: number;
}

export function emptySection(): Section {
  return { area: 0, topWidth: 0, perimeter: 0 };
}

/** The section of a barrel flowing `depth` deep (clamped to 0..rise), written into `out`. */
export function sectionAt(b: Barrel, depth: number, out: Section): Section {
  if (b.shape === "circular") {
    // With r = y/D: sin(theta/2) = 2 sqrt(r (1 - r)) and cos(theta/2) = 1 - 2r, so one arcsine serves.
    const d = b.diameter;
    const r = Math.min(Math.max(depth / d, 0), 1);
    const halfSine = 2 * Math.sqrt(r * (1 - r));
    const theta = 4 * Math.asin(Math.sqrt(r));
    const thetaLessSine = theta < 0.01 ? thetaMinusSine(theta) : theta - halfSine * (2 - 4 * r);
    out.area = (d * d * thetaLessSine) / 8;
    out.perimeter = 0.5 * d * theta;
    out.topWidth = d * halfSine;
  } else {
    const y = Math.min(Math.max(depth, 0), b.rise);
    out.area = b.span * y;
    out.perimeter = b.span + 2 * y;
    out.topWidth = b.span;
  }
  return out;
}

/** Manning's friction slope Sf = (n Q)^2 / (A^2 R^(4/3)) of a section (SI, R = A/P). */
export function frictionSlope(s: Section, flow: number, manningN: number): number {
  const r = s.area / s.perimeter;
  const v = (manningN * flow) / s.area;
  return (v * v) / (r * Math.cbrt(r));
}

/** Froude number squared, Fr^2 = Q^2 T / (g A^3). */
export function froudeSquared(s: Section, flow: number): number {
  return (flow * flow * s.topWidth) / (GRAVITY * s.area * s.area * s.area);
}

/** Velocity head V^2/2g (m) of a section at a flow. */
export function velocityHead(s: Section, flow: number): number {
  const v = flow / s.area;
  return (v * v) / (2 * GRAVITY);
}
