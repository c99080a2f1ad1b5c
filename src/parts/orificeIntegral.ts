// The orifice equation (HEC-22 eq 8-17, Q = Cd A sqrt(2 g H)) integrated over a wetted opening, as
// the case-format contract defines an orifice's flow:
//   Q = Cd sqrt(2g) * integral of width(y) sqrt(WS - max(y, DS)) dy over the opening below WS.
// The part below the downstream level DS sees the head WS - DS; the part above it WS - y. There is
// no switch to a centroid formula, so the rating is smooth from a weir-like start to full flow. The
// integrals of a rectangle and a circle, shared by the orifice kinds and the sweep's circle table.
import { GRAVITY } from "../units.js";
import { gaussLegendre, type Rule } from "./quadrature.js";

export const SQRT_2G = Math.sqrt(2 * GRAVITY);
const RULE = gaussLegendre(24);
/** The short rule a rating sweep may use where the water stands over the whole opening (see
 * `circularOpeningIntegral`); the tests hold it within 1e-6 of the 24-point rule there. */
export const SHORT_RULE = gaussLegendre(8);
/** Depth of water over the opening's top, in diameters, from which the short rule is used. */
export const SHORT_RULE_COVER = 0.05;
// The rule mapped to the whole circle (theta from 0 to pi): the common case of a wetted, free opening.
const FULL_SIN2 = RULE.nodes.map((u) => Math.sin(Math.PI * u) ** 2);
const FULL_COS = RULE.nodes.map((u) => Math.cos(Math.PI * u));

/** Integral of width(y) sqrt(WS - max(y, DS)) dy over a rectangle (closed form). */
export function rectangularOpeningIntegral(width: number, height: number, invert: number, ws: number, ds: number): number {
  const top = invert + height;
  let total = 0;
  const submergedTop = Math.min(ds, top);
  if (submergedTop > invert) total += width * (submergedTop - invert) * Math.sqrt(ws - ds);
  const a = Math.max(invert, ds);
  const b = Math.min(top, ws);
  if (b > a) total += width * (2 / 3) * ((ws - a) * Math.sqrt(ws - a) - (ws - b) * Math.sqrt(ws - b));
  return total;
}

/**
 * Integral of width(y) sqrt(WS - max(y, DS)) dy over a circle of diameter D with its bottom at
 * `invert`. `rule` is the Gauss-Legendre rule for the part above DS when the water stands over the
 * whole opening (the integrand is smooth there; SHORT_RULE once it stands SHORT_RULE_COVER
 * diameters over the top); where WS cuts the opening the 24-point rule is always used.
 */
export function circularOpeningIntegral(diameter: number, invert: number, ws: number, ds: number, rule: Rule = RULE): number {
  const r = diameter / 2;
  const center = invert + r;
  const top = invert + diameter;
  if (ds <= invert && ws >= top) return wettedCircleIntegral(r, ws - center);
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
    let sum = 0;
    if (b >= top) {
      const nodes = rule.nodes;
      const weights = rule.weights;
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
      const nodes = RULE.nodes;
      const weights = RULE.weights;
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

/**
 * A circle wholly below the water surface and free of the downstream level, head h on its centre.
 * For h >= 2r the integral is A sqrt(h) times the series 1 - p^2/32 - 5p^4/1024 - 105p^6/65536 -
 * 3003p^8/4194304 (p = r/h; binomial series of sqrt(h - z) integrated against the circle's even
 * moments r^2/4, r^4/8, 5r^6/64, 7r^8/128), whose truncation error is below 1e-6 there; closer to
 * the surface the 24-point rule on the whole circle.
 */
export function wettedCircleIntegral(r: number, h: number): number {
  if (h >= 2 * r) {
    const p2 = (r * r) / (h * h);
    const series = 1 - p2 * (1 / 32 + p2 * (5 / 1024 + p2 * (105 / 65536 + p2 * (3003 / 4194304))));
    return Math.PI * r * r * Math.sqrt(h) * series;
  }
  let sum = 0;
  const w = RULE.weights;
  for (let k = 0; k < w.length; k++) {
    const head = h + r * FULL_COS[k];
    sum += w[k] * FULL_SIN2[k] * Math.sqrt(head > 0 ? head : 0);
  }
  return 2 * r * r * Math.PI * sum;
}

/** Area of a circle's segment of height h measured from its bottom. */
export function segmentArea(r: number, h: number): number {
  if (h <= 0) return 0;
  if (h >= 2 * r) return Math.PI * r * r;
  const c = r - h;
  return r * r * Math.acos(c / r) - c * Math.sqrt(2 * r * h - h * h);
}

function clampUnit(x: number): number {
  return x < -1 ? -1 : x > 1 ? 1 : x;
}
