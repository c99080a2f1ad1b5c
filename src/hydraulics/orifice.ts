// Orifices: the orifice equation (HEC-22 eq 8-17, Q = Cd A sqrt(2 g H)) integrated over the wetted
// opening, as the case-format contract defines it:
//   Q = Cd sqrt(2g) * integral of width(y) sqrt(WS - max(y, DS)) dy over the opening below WS.
// The part below the downstream level DS sees the head WS - DS; the part above it WS - y. There is
// no switch to a centroid formula, so the rating is smooth from a weir-like start to full flow.
import type { Orifice } from "../case/model.js";
import { GRAVITY } from "../units.js";
import { gaussLegendre } from "./quadrature.js";

const SQRT_2G = Math.sqrt(2 * GRAVITY);
const RULE = gaussLegendre(24);

/** Flow through all openings of an orifice element (m3/s). */
export function orificeFlow(o: Orifice, ws: number, ds: number): number {
  if (ws <= o.invert || ds >= ws) return 0;
  const one =
    o.shape === "circular"
      ? circularOpeningIntegral(o.diameter, o.invert, ws, ds)
      : rectangularOpeningIntegral(o.width, o.height, o.invert, ws, ds);
  return o.count * o.coefficient * SQRT_2G * one;
}

/** Integral of width(y) sqrt(WS - max(y, DS)) dy over a rectangle (closed form). */
export function rectangularOpeningIntegral(width: number, height: number, invert: number, ws: number, ds: number): number {
  const top = invert + height;
  let total = 0;
  const submergedTop = Math.min(ds, top);
  if (submergedTop > invert) total += width * (submergedTop - invert) * Math.sqrt(ws - ds);
  const a = Math.max(invert, ds);
  const b = Math.min(top, ws);
  if (b > a) total += width * (2 / 3) * (Math.pow(ws - a, 1.5) - Math.pow(ws - b, 1.5));
  return total;
}

/** Integral of width(y) sqrt(WS - max(y, DS)) dy over a circle of diameter D with its bottom at `invert`. */
export function circularOpeningIntegral(diameter: number, invert: number, ws: number, ds: number): number {
  const r = diameter / 2;
  const center = invert + r;
  const top = invert + diameter;
  let total = 0;
  const submergedTop = Math.min(ds, top);
  if (submergedTop > invert) total += segmentArea(r, submergedTop - invert) * Math.sqrt(ws - ds);
  const a = Math.max(invert, ds);
  const b = Math.min(top, ws);
  if (b > a) {
    // y = center - r cos(theta): width = 2 r sin(theta), dy = r sin(theta) dtheta.
    const thetaA = Math.acos(clampUnit((center - a) / r));
    const thetaB = Math.acos(clampUnit((center - b) / r));
    const span = thetaB - thetaA;
    const nodes = RULE.nodes;
    const weights = RULE.weights;
    let sum = 0;
    if (b >= top) {
      // The whole upper part is wetted: the integrand is smooth in theta.
      for (let k = 0; k < nodes.length; k++) {
        const theta = thetaA + span * nodes[k];
        const s = Math.sin(theta);
        const head = ws - center + r * Math.cos(theta);
        sum += weights[k] * s * s * Math.sqrt(head > 0 ? head : 0);
      }
      total += 2 * r * r * span * sum;
    } else {
      // WS cuts the opening: theta = thetaB - span u^2 removes the square-root end point.
      for (let k = 0; k < nodes.length; k++) {
        const u = nodes[k];
        const theta = thetaB - span * u * u;
        const s = Math.sin(theta);
        const head = ws - center + r * Math.cos(theta);
        sum += weights[k] * s * s * Math.sqrt(head > 0 ? head : 0) * 2 * u;
      }
      total += 2 * r * r * span * sum;
    }
  }
  return total;
}

/** Area of a circle's segment of height h measured from its bottom. */
export function segmentArea(r: number, h: number): number {
  if (h <= 0) return 0;
  if (h >= 2 * r) return Math.PI * r * r;
  const c = r - h;
  return r * r * Math.acos(c / r) - c * Math.sqrt(2 * r * h - h * h);
}

/** Area of one opening. */
export function openingArea(o: Orifice): number {
  return o.shape === "circular" ? (Math.PI * o.diameter * o.diameter) / 4 : o.width * o.height;
}

/** Height of one opening. */
export function openingHeight(o: Orifice): number {
  return o.shape === "circular" ? o.diameter : o.height;
}

/** Wall width taken by all openings of an element side by side. */
export function openingWidth(o: Orifice): number {
  return o.count * (o.shape === "circular" ? o.diameter : o.width);
}

function clampUnit(x: number): number {
  return x < -1 ? -1 : x > 1 ? 1 : x;
}
