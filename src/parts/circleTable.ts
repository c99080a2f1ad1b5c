// The orifice integral of a circular opening free of the downstream level, from a dimensionless
// table: for a circle of diameter D with head h on its invert,
//   I(D, h) = integral of width(y) sqrt(h - y) dy over the wetted circle = D^2.5 Phi(h / D),
// and G(eta) = Phi(eta) / eta^2 = I / (D^0.5 h^2) is smooth from G(0) = pi/4 (the bottom of the
// circle is a parabola, width 2 sqrt(D y): 2 sqrt(D) h^2 B(3/2, 3/2) = pi sqrt(D) h^2 / 4) to
// eta = 1.5, where the series of orificeIntegral.ts takes over. G is tabulated at CIRCLE_TABLE_POINTS even
// steps of eta (with the node at eta = 1, the top of the opening) from the direct integral
// (`circularOpeningIntegral`) and interpolated linearly; the tests hold it within
// CIRCLE_TABLE_TOLERANCE of the direct integral.
import { circularOpeningIntegral, wettedCircleIntegral } from "./orificeIntegral.js";

/** Table intervals on eta = h / D from 0 to 1.5 (a multiple of 3, so that eta = 1 is a node). */
export const CIRCLE_TABLE_POINTS = 3072;
/** Head over diameter from which the direct series is used (as in orificeIntegral.ts, h - r >= 2r). */
export const CIRCLE_TABLE_END = 1.5;
/** Stated error of the table: relative to the direct integral. */
export const CIRCLE_TABLE_TOLERANCE = 1e-6;

const STEP = CIRCLE_TABLE_END / CIRCLE_TABLE_POINTS;
const G = new Float64Array(CIRCLE_TABLE_POINTS + 1);
G[0] = Math.PI / 4;
for (let i = 1; i <= CIRCLE_TABLE_POINTS; i++) {
  const eta = i * STEP;
  G[i] = circularOpeningIntegral(1, 0, eta, -Infinity) / (eta * eta);
}

/** The orifice integral of a circle of diameter D, free of the downstream level, head h (m) on its invert. */
export function wettedCircleTabulated(diameter: number, h: number): number {
  if (!(h > 0)) return 0;
  const eta = h / diameter;
  if (eta >= CIRCLE_TABLE_END) return wettedCircleIntegral(diameter / 2, h - diameter / 2);
  const x = eta / STEP;
  const i = Math.floor(x);
  const g = G[i] + (G[i + 1] - G[i]) * (x - i);
  return Math.sqrt(diameter) * h * h * g;
}
