// The barrel that drains the chamber, by FHWA HDS-5 (Hydraulic Design of Highway Culverts, 2nd ed.
// 2001, ch. III and App. A; 3rd ed. 2012, App. A). Headwater HW is measured above the inlet invert;
// the larger of the inlet-control and outlet-control headwaters governs (case-format contract).
//
// Inlet control, x = Ku Q / (A D^0.5) with A the full area and D the rise:
//   unsubmerged (x <= 3.5)  form 1: HW/D = Hc/D + K x^M + Ks S,  Hc = dc + Vc^2/2g
//                           form 2: HW/D = K x^M
//   submerged   (x >= 4.0)          HW/D = c x^2 + Y + Ks S
//   between: a straight line in x from the unsubmerged value at 3.5 to the submerged value at 4.0.
// Outlet control (full-flow energy equation, HDS-5 2nd ed. eqs 5, 7, 10):
//   H = (1 + ke + 29 n^2 L / R^1.33) V^2/2g (US),  HW = H + ho - L S,  ho = max(TW, (dc + D)/2),
//   TW and ho measured above the outlet invert; S = (inlet invert - outlet invert) / length.
//
// Units: K, M, c, Y and the 29 in the friction term are for US customary units. The conversion is
// made here, at the boundary: x is computed from SI values and multiplied by 1/sqrt(0.3048) =
// 1.8113 (HDS-5's Ku = 1.811 for SI), and the friction term takes L and R in feet (the same as
// HDS-5's SI constant 19.63 with L and R in metres). Everything else is dimensionless or SI, g =
// 9.80665 m/s2.
import type { Barrel } from "../case/model.js";
import { FOOT, GRAVITY } from "../units.js";
import { entrance, type Entrance } from "./entrances.js";
import { barrelCriticalDepth, circularFlowArea } from "./criticalDepth.js";
import { brentRoot } from "./roots.js";
import { barrelArea, barrelRise, barrelSlope, fullHydraulicRadius } from "./barrelSection.js";

/** Largest x = Ku Q/(A D^0.5) of the unsubmerged forms, smallest of the submerged form (HDS-5 App. A). */
export const UNSUBMERGED_LIMIT = 3.5;
export const SUBMERGED_LIMIT = 4.0;
/** Ku for SI: multiplies Q/(A D^0.5) in m3/s, m2, m to give its value in cfs, ft2, ft. */
export const KU_SI = 1 / Math.sqrt(FOOT);
/** Friction constant of the full-flow loss equation, US units (HDS-5 2nd ed. eq 7: 29 = 2g/1.486^2). */
export const FRICTION_CONSTANT_US = 29;
/** Exponent of the hydraulic radius in the full-flow loss equation as HDS-5 prints it. */
export const RADIUS_EXPONENT = 1.33;

export { barrelArea, barrelRise, barrelSlope, fullHydraulicRadius };

/** x = Ku Q / (A D^0.5) in US units, the argument of HDS-5's inlet-control forms. */
export function flowParameter(b: Barrel, flow: number): number {
  return (KU_SI * flow) / (barrelArea(b) * Math.sqrt(barrelRise(b)));
}

/** Critical depth (m) in the barrel, no more than its rise. */
export const criticalDepth = barrelCriticalDepth;

/** Specific head at critical depth, Hc = dc + Vc^2/2g (m). */
export function criticalHead(b: Barrel, flow: number, dc: number): number {
  if (!(flow > 0) || !(dc > 0)) return 0;
  const area = b.shape === "circular" ? circularFlowArea(b.diameter, dc) : b.span * dc;
  const v = flow / area;
  return dc + (v * v) / (2 * GRAVITY);
}

/** HDS-5 unsubmerged inlet control, HW/D, for x (US units), slope S and Hc/D (form 1 only). */
export function unsubmergedRatio(e: Entrance, x: number, slope: number, criticalHeadRatio: number): number {
  return e.form === 1 ? criticalHeadRatio + e.K * Math.pow(x, e.M) + e.Ks * slope : e.K * Math.pow(x, e.M);
}

/** HDS-5 submerged inlet control, HW/D, for x (US units) and slope S. */
export function submergedRatio(e: Entrance, x: number, slope: number): number {
  return e.c * x * x + e.Y + e.Ks * slope;
}

/**
 * Unsubmerged HW/D of a barrel at a flow. At very small flows the fitted forms fall below the
 * critical specific head Hc, the least energy with which the flow can pass the inlet (the slope
 * term alone makes form 1 negative as Q -> 0); there Hc is used, so the headwater rises strictly
 * and continuously from zero.
 */
function unsubmergedHeadwaterRatio(b: Barrel, e: Entrance, flow: number, slope: number, dc: number): number {
  const hcRatio = criticalHead(b, flow, dc) / barrelRise(b);
  return Math.max(unsubmergedRatio(e, flowParameter(b, flow), slope, hcRatio), hcRatio);
}

/** Inlet-control headwater above the inlet invert (m) for a flow (m3/s); `dc` its critical depth. */
export function inletControlHeadwater(b: Barrel, flow: number, dc = criticalDepth(b, flow)): number {
  const e = entrance(b.entrance);
  const rise = barrelRise(b);
  const slope = barrelSlope(b);
  const q = flow > 0 ? flow : 0;
  const x = flowParameter(b, q);
  if (x <= UNSUBMERGED_LIMIT) return rise * unsubmergedHeadwaterRatio(b, e, q, slope, dc);
  if (x >= SUBMERGED_LIMIT) return rise * submergedRatio(e, x, slope);
  const flowAtLimit = (UNSUBMERGED_LIMIT * barrelArea(b) * Math.sqrt(rise)) / KU_SI;
  const low = unsubmergedHeadwaterRatio(b, e, flowAtLimit, slope, criticalDepth(b, flowAtLimit));
  const high = submergedRatio(e, SUBMERGED_LIMIT, slope);
  return rise * (low + ((x - UNSUBMERGED_LIMIT) / (SUBMERGED_LIMIT - UNSUBMERGED_LIMIT)) * (high - low));
}

/** Full-flow head loss H = (1 + ke + 29 n^2 L / R^1.33) V^2/2g (m), HDS-5 2nd ed. eq 7 (US constant). */
export function outletControlLoss(b: Barrel, flow: number): number {
  const e = entrance(b.entrance);
  const lengthFeet = b.length / FOOT;
  const radiusFeet = fullHydraulicRadius(b) / FOOT;
  const friction = (FRICTION_CONSTANT_US * b.manningN * b.manningN * lengthFeet) / Math.pow(radiusFeet, RADIUS_EXPONENT);
  const v = flow / barrelArea(b);
  return (1 + e.ke + friction) * ((v * v) / (2 * GRAVITY));
}

/**
 * Outlet-control headwater above the inlet invert (m): HW = H + ho - L S with
 * ho = max(TW - outlet invert, (dc + D)/2) (HDS-5 2nd ed. eq 10 and ch. III step 4). `tailwater`
 * is an elevation, -Infinity for a free outfall. Can be negative on a steep barrel (inlet control
 * then governs).
 */
export function outletControlHeadwater(b: Barrel, flow: number, tailwater: number, dc = criticalDepth(b, flow)): number {
  const q = flow > 0 ? flow : 0;
  const ho = Math.max(tailwater - b.outletInvert, 0.5 * (dc + barrelRise(b)));
  return outletControlLoss(b, q) + ho - (b.inletInvert - b.outletInvert);
}

/** Headwater above the inlet invert (m) for a flow: the larger of inlet and outlet control, >= 0. */
export function barrelHeadwater(b: Barrel, flow: number, tailwater: number): number {
  const dc = criticalDepth(b, flow);
  const inlet = inletControlHeadwater(b, flow, dc);
  const outlet = outletControlHeadwater(b, flow, tailwater, dc);
  return Math.max(inlet, outlet, 0);
}

export interface BarrelState {
  flow: number;
  /** Inlet- and outlet-control headwaters above the inlet invert (m). */
  inletHeadwater: number;
  outletHeadwater: number;
  /** The governing (larger) headwater, >= 0 (m). */
  headwater: number;
  control: "inlet" | "outlet";
  criticalDepth: number;
  /** x = Ku Q/(A D^0.5), US units. */
  flowParameter: number;
  /** Tailwater depth above the outlet invert (m), -Infinity for a free outfall. */
  tailwaterDepth: number;
}

/** Everything the barrel does at one flow (for reports and warnings). */
export function barrelState(b: Barrel, flow: number, tailwater: number): BarrelState {
  const dc = criticalDepth(b, flow);
  const inlet = inletControlHeadwater(b, flow, dc);
  const outlet = outletControlHeadwater(b, flow, tailwater, dc);
  return {
    flow,
    inletHeadwater: inlet,
    outletHeadwater: outlet,
    headwater: Math.max(inlet, outlet, 0),
    control: inlet >= outlet ? "inlet" : "outlet",
    criticalDepth: dc,
    flowParameter: flowParameter(b, flow),
    tailwaterDepth: tailwater - b.outletInvert,
  };
}

/**
 * The barrel's flow (m3/s) for a headwater elevation in front of its inlet (the chamber level):
 * the inverse of `barrelHeadwater`. Zero while the headwater does not exceed the one at zero flow
 * (e.g. a tailwater above the inlet); monotone and finite for every input.
 */
export function barrelFlow(b: Barrel, headwaterElevation: number, tailwater: number): number {
  const head = headwaterElevation - b.inletInvert;
  if (!(head > barrelHeadwater(b, 0, tailwater))) return 0;
  // A sharp orifice of the full area at this head passes less than the barrel's inlet control
  // allows (the submerged form's c x^2 term alone exceeds the head), so this brackets the root.
  let high = barrelArea(b) * Math.sqrt(2 * GRAVITY * Math.max(head, barrelRise(b)));
  let excess = barrelHeadwater(b, high, tailwater) - head;
  for (let i = 0; i < 60 && excess < 0; i++) {
    high *= 2;
    excess = barrelHeadwater(b, high, tailwater) - head;
  }
  const f = (q: number) => barrelHeadwater(b, q, tailwater) - head;
  return brentRoot(f, 0, high, f(0), excess, 1e-12 * high);
}
