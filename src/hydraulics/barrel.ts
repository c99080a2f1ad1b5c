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
// HDS-5 finds this approximation adequate down to HW = 0.75 D and best when the barrel flows full
// over part of its length; for lower headwaters it calls for a backwater calculation (2nd ed. ch.
// III, partly full flow). So the formula is used exactly where its HW >= 0.75 D, or where the
// backwater profile reaches the crown; below 0.6 D the outlet-control headwater is that of the
// subcritical backwater profile from the outlet (backwater.ts), HW = inlet depth + (1 + ke) V^2/2g,
// and between 0.6 D and 0.75 D a linear blend of the two in the formula's HW/D keeps HW continuous.
// On a steep barrel whose supercritical flow is not drowned (the profile falls to critical depth
// inside the barrel, or the tailwater is below it) outlet control does not govern.
//
// Units: K, M, c, Y and the 29 in the friction term are for US customary units. The conversion is
// made here, at the boundary: x is computed from SI values and multiplied by 1/sqrt(0.3048) =
// 1.8113 (HDS-5's Ku = 1.811 for SI), and the friction term takes L and R in feet (the same as
// HDS-5's SI constant 19.63 with L and R in metres). Everything else is dimensionless or SI, g =
// 9.80665 m/s2.
import type { Barrel } from "../model.js";
import { FOOT, GRAVITY } from "../units.js";
import { entrance, type Entrance } from "../parts/entrances.js";
import { barrelCriticalDepth, circularFlowArea } from "./criticalDepth.js";
import { brentRoot } from "./roots.js";
import { barrelSlope, emptySection, sectionAt } from "./barrelSection.js";
import { barrelArea, barrelRise, fullHydraulicRadius } from "../parts/barrel.js";
import { backwaterProfile, type Profile } from "./backwater.js";

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
 * HDS-5's approximate outlet-control headwater above the inlet invert (m): HW = H + ho - L S with
 * ho = max(TW - outlet invert, (dc + D)/2) (HDS-5 2nd ed. eq 10 and ch. III step 4; the
 * case-format contract's formula). `tailwater` is an elevation, -Infinity for a free outfall. Can
 * be negative on a steep barrel (inlet control then governs).
 */
export function approximateOutletHeadwater(b: Barrel, flow: number, tailwater: number, dc = criticalDepth(b, flow)): number {
  const q = flow > 0 ? flow : 0;
  const ho = Math.max(tailwater - b.outletInvert, 0.5 * (dc + barrelRise(b)));
  return outletControlLoss(b, q) + ho - (b.inletInvert - b.outletInvert);
}

/**
 * Where HDS-5's approximation holds. HDS-5 (2nd ed. 2001, ch. III, outlet control, partly full
 * flow; references.md sec. 1.3) finds the approximation ho = max(TW, (dc + D)/2) best when the
 * barrel flows full over at least part of its length, adequate down to a headwater of 0.75 D, and
 * calls for a backwater calculation below that. So: HW/D >= 0.75 from the approximation, or a
 * profile that reaches the crown, keeps the approximation exactly.
 */
export const APPROXIMATION_MIN_RATIO = 0.75;
/**
 * Below this HW/D of the approximation the backwater profile alone gives the outlet-control
 * headwater; between it and 0.75 the two are blended linearly in that ratio, so that the headwater
 * is continuous in the flow where the method changes. The width of the blend is this project's
 * choice, not HDS-5's.
 */
export const PROFILE_ONLY_RATIO = 0.6;

/** Below this x = Ku Q/(A D^0.5) (about 1e-12 cfs in a 24-in pipe) the flow is taken as still water:
 * the profile's squares of the flow would underflow. */
export const STILL_WATER_X = 1e-12;

/**
 * How the outlet-control headwater was found:
 * - "approximation": HDS-5's formula, its headwater at or above 0.75 D;
 * - "full over part": HDS-5's formula, because the profile fills the barrel to its crown;
 * - "profile": the backwater profile, HW = inlet depth + (1 + ke) V^2/2g;
 * - "blend": between the profile and the formula (approximate HW/D from 0.6 to 0.75);
 * - "inlet": on a steep barrel the supercritical flow from the inlet is not drowned (the
 *   subcritical profile falls to critical depth inside the barrel, or the tailwater is below
 *   critical depth), so outlet control does not govern; the inlet-control headwater is reported.
 */
export type OutletMethod = "approximation" | "full over part" | "profile" | "blend" | "inlet";

export interface OutletControl {
  /** Outlet-control headwater above the inlet invert (m). */
  headwater: number;
  method: OutletMethod;
  /** HDS-5's approximate headwater H + ho - L S (m), whether used or not. */
  approximation: number;
  /** The backwater profile, when one was computed. */
  profile: Profile | null;
}

/** Headwater above the inlet invert (m) of the profile's inlet depth: y + (1 + ke) V^2/2g. */
function profileHeadwater(b: Barrel, flow: number, depth: number): number {
  const area = sectionAt(b, depth, inletSection).area;
  const v = flow / area;
  return depth + (1 + entrance(b.entrance).ke) * ((v * v) / (2 * GRAVITY));
}
const inletSection = emptySection();

/**
 * Outlet-control headwater above the inlet invert (m), by HDS-5's approximation where HDS-5 says
 * it applies and by a backwater profile from the outlet where it does not (see `OutletMethod`).
 * `tailwater` is an elevation, -Infinity for a free outfall.
 */
export function outletControl(b: Barrel, flow: number, tailwater: number, dc = criticalDepth(b, flow)): OutletControl {
  const q = flow > 0 ? flow : 0;
  const rise = barrelRise(b);
  const approximation = approximateOutletHeadwater(b, q, tailwater, dc);
  const ratio = approximation / rise;
  if (ratio >= APPROXIMATION_MIN_RATIO) return { headwater: approximation, method: "approximation", approximation, profile: null };
  let partFull: number;
  let method: OutletMethod = "profile";
  let profile: Profile | null = null;
  if (flowParameter(b, q) < STILL_WATER_X) {
    // Still water: the tailwater, or (adverse barrel) up to the outlet invert.
    partFull = Math.max(tailwater, b.outletInvert) - b.inletInvert;
  } else {
    profile = backwaterProfile(b, q, tailwater - b.outletInvert);
    if (profile.end === "crown") return { headwater: approximation, method: "full over part", approximation, profile };
    if (profile.end === "critical") {
      method = "inlet";
      partFull = inletControlHeadwater(b, q, dc);
    } else {
      partFull = profileHeadwater(b, q, profile.depth);
    }
  }
  if (ratio < PROFILE_ONLY_RATIO) return { headwater: partFull, method, approximation, profile };
  const weight = (ratio - PROFILE_ONLY_RATIO) / (APPROXIMATION_MIN_RATIO - PROFILE_ONLY_RATIO);
  return { headwater: partFull + weight * (approximation - partFull), method: "blend", approximation, profile };
}

/** Outlet-control headwater above the inlet invert (m) for a flow (see `outletControl`). */
export function outletControlHeadwater(b: Barrel, flow: number, tailwater: number, dc = criticalDepth(b, flow)): number {
  return outletControl(b, flow, tailwater, dc).headwater;
}

/**
 * Why an outlet-control headwater is doubtful:
 * - "step limit": the profile took the most steps allowed short of the inlet (its last depth is used);
 * - "adverse, part full": an adverse barrel (inlet below outlet) where HDS-5's formula applies by
 *   its headwater (>= 0.75 D, measured above the low inlet invert) while the backwater profile
 *   shows the barrel part full over its whole length; the formula's ho = (dc + D)/2 at the outlet
 *   then overstates the headwater (at small flows by up to D/2).
 */
export type OutletDoubt = "step limit" | "adverse, part full";

/** Whether the outlet-control headwater at a flow is doubtful (see `OutletDoubt`), or null. */
export function outletControlDoubt(b: Barrel, flow: number, tailwater: number): OutletDoubt | null {
  const control = outletControl(b, flow, tailwater);
  if (control.profile) return control.profile.limited ? "step limit" : null;
  // HDS-5's 0.75 D presumes the headwater shows how full the barrel runs; on an adverse barrel the
  // drop to the inlet alone can lift it past 0.75 D, so the profile is looked at there.
  const adverse = barrelSlope(b) < 0 && flowParameter(b, flow) >= STILL_WATER_X && tailwater - b.outletInvert < barrelRise(b);
  if (control.method !== "approximation" || !adverse) return null;
  return backwaterProfile(b, flow, tailwater - b.outletInvert).end === "inlet" ? "adverse, part full" : null;
}

/**
 * Headwater above the inlet invert (m) for a flow: the larger of inlet and outlet control, >= 0.
 * The exact pointwise value; it may fall slightly where a steep barrel's drowned inlet gives way
 * to a jump in the barrel (the drowned value carries the entrance loss, inlet control does not) or
 * where a profile first reaches the crown. `barrelCurve` holds such dips level.
 */
export function barrelHeadwater(b: Barrel, flow: number, tailwater: number): number {
  const dc = criticalDepth(b, flow);
  const inlet = inletControlHeadwater(b, flow, dc);
  const outlet = outletControl(b, flow, tailwater, dc).headwater;
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
  /** How the outlet-control headwater was found, and the profile if one was computed. */
  outlet: OutletControl;
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
  const outlet = outletControl(b, flow, tailwater, dc);
  return {
    flow,
    inletHeadwater: inlet,
    outletHeadwater: outlet.headwater,
    headwater: Math.max(inlet, outlet.headwater, 0),
    control: inlet >= outlet.headwater ? "inlet" : "outlet",
    outlet,
    criticalDepth: dc,
    flowParameter: flowParameter(b, flow),
    tailwaterDepth: tailwater - b.outletInvert,
  };
}

/**
 * The barrel's flow (m3/s) for a headwater elevation in front of its inlet, by root-finding on the
 * exact `barrelHeadwater` (the reference the tabulated `barrelFlow` is checked against). Zero while
 * the headwater does not exceed the one at zero flow (e.g. a tailwater above the inlet).
 */
export function exactBarrelFlow(b: Barrel, headwaterElevation: number, tailwater: number): number {
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

/** The exact headwater at a flow, with a number naming the formula that gives it. */
export interface BarrelPoint {
  headwater: number;
  /** Changes wherever the governing formula changes (a kink or a step of HW(Q) may lie between two
   * flows with different regimes, none between two with the same). */
  regime: number;
}

const METHOD_INDEX: Record<OutletMethod, number> = { approximation: 0, "full over part": 1, profile: 2, blend: 3, inlet: 4 };
const KIND_INDEX: Record<Profile["kind"], number> = { M1: 1, M2: 2, S1: 3, H2: 4, A2: 5, uniform: 6, "full at outlet": 7, "supercritical at outlet": 8 };

/** `barrelHeadwater` with its regime, for the tabulated curve (barrelCurve.ts). */
export function barrelPoint(b: Barrel, flow: number, tailwater: number): BarrelPoint {
  const q = flow > 0 ? flow : 0;
  const dc = criticalDepth(b, q);
  const inlet = inletControlHeadwater(b, q, dc);
  const outlet = outletControl(b, q, tailwater, dc);
  const headwater = Math.max(inlet, outlet.headwater, 0);
  if (headwater === 0) return { headwater, regime: 0 };
  if (inlet >= outlet.headwater) {
    const x = flowParameter(b, q);
    const rise = barrelRise(b);
    const hcRatio = criticalHead(b, q, dc) / rise;
    const floored = unsubmergedRatio(entrance(b.entrance), x, barrelSlope(b), hcRatio) < hcRatio;
    return { headwater, regime: x <= UNSUBMERGED_LIMIT ? (floored ? 1 : 2) : x >= SUBMERGED_LIMIT ? 4 : 3 };
  }
  const tailwaterGoverns = tailwater - b.outletInvert >= 0.5 * (dc + barrelRise(b)) ? 1 : 0;
  const kind = outlet.profile ? KIND_INDEX[outlet.profile.kind] : 0;
  return { headwater, regime: 8 + tailwaterGoverns + 2 * (METHOD_INDEX[outlet.method] + 5 * kind) };
}
