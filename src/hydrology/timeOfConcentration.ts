// Time of concentration from flow-path segments (NRCS TR-55, 2nd ed. 1986, ch. 3) and the watershed lag
// method (NEH Part 630 ch. 15). SI inside: metres, seconds; the published forms are in feet and hours.

const FOOT = 0.3048;
const INCH = 0.0254;
const HOUR = 3600;

/** TR-55's longest sheet-flow segment: 300 ft (TR-55 ch. 3, "sheet flow is flow ... less than about 300 feet"). */
export const MAX_SHEET_LENGTH = 300 * FOOT;
/** TR-55's smallest Tc: 0.1 h (TR-55 ch. 3 and App. F limitations). */
export const MIN_TC_NRCS = 0.1 * HOUR;

export type FlowSegment =
  | { type: "sheet"; length: number; slope: number; manningN: number }
  | { type: "shallow"; length: number; slope: number; surface: "paved" | "unpaved" }
  | { type: "channel"; length: number; slope: number; manningN: number; hydraulicRadius: number };

/**
 * Sheet-flow travel time (s), TR-55 eq 3-3 (Overton & Meadows kinematic solution):
 * Tt = 0.007 (n L)^0.8 / (P2^0.5 s^0.4), Tt h, L ft, P2 the 2-year 24-hour rainfall in inches, s ft/ft.
 */
export function sheetFlowTime(length: number, slope: number, manningN: number, twoYearRainfall: number): number {
  const hours = (0.007 * Math.pow(manningN * (length / FOOT), 0.8)) / (Math.sqrt(twoYearRainfall / INCH) * Math.pow(slope, 0.4));
  return hours * HOUR;
}

/**
 * Average velocity (m/s) of shallow concentrated flow, TR-55 App. F (the equations behind Figure 3-1):
 * unpaved V = 16.1345 s^0.5, paved V = 20.3282 s^0.5 (ft/s).
 */
export function shallowFlowVelocity(slope: number, surface: "paved" | "unpaved"): number {
  return (surface === "paved" ? 20.3282 : 16.1345) * Math.sqrt(slope) * FOOT;
}

/** Manning's velocity (m/s), SI form V = r^(2/3) s^(1/2) / n (TR-55 eq 3-4 in US units: 1.49 r^(2/3) s^(1/2) / n). */
export function manningVelocity(hydraulicRadius: number, slope: number, manningN: number): number {
  return (Math.pow(hydraulicRadius, 2 / 3) * Math.sqrt(slope)) / manningN;
}

/** Travel time (s) of one segment; sheet flow needs the 2-year 24-hour rainfall (m). */
export function travelTime(segment: FlowSegment, twoYearRainfall: number): number {
  switch (segment.type) {
    case "sheet":
      return sheetFlowTime(segment.length, segment.slope, segment.manningN, twoYearRainfall);
    case "shallow":
      return segment.length / shallowFlowVelocity(segment.slope, segment.surface);
    case "channel":
      return segment.length / manningVelocity(segment.hydraulicRadius, segment.slope, segment.manningN);
  }
}

/**
 * Watershed lag L (s), NEH Part 630 ch. 15 lag equation: L = l^0.8 (S + 1)^0.7 / (1900 Y^0.5), L h,
 * l the hydraulic length (ft), S = 1000/CN - 10 (in), Y the average land slope in percent (here given as a
 * fraction). The time of concentration is L / 0.6 (NEH 630 ch. 15).
 */
export function watershedLag(flowLength: number, slope: number, curveNumber: number): number {
  const s = 1000 / curveNumber - 10;
  const hours = (Math.pow(flowLength / FOOT, 0.8) * Math.pow(s + 1, 0.7)) / (1900 * Math.sqrt(100 * slope));
  return hours * HOUR;
}

/** Tc of the lag relation Tc = L / 0.6 (NEH 630 ch. 15 and ch. 16). */
export function tcFromLag(lag: number): number {
  return lag / 0.6;
}
