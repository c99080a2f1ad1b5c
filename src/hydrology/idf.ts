// Rainfall intensity-duration relations for the rational method. SI inside: seconds, m/s.

export type IdfCurve =
  /** Tabulated [duration, intensity] points, read by log-log interpolation. */
  | { kind: "table"; durations: number[]; intensities: number[] }
  /** i = a / (t + b)^c with t and b in minutes; `a` already carries the intensity unit (m/s * min^c). */
  | { kind: "formula"; a: number; b: number; c: number };

/** Durations (s) an IDF curve can answer for: the table's range, or any positive duration. */
export function idfRange(curve: IdfCurve): [number, number] {
  return curve.kind === "table" ? [curve.durations[0], curve.durations[curve.durations.length - 1]] : [0, Infinity];
}

/**
 * Intensity (m/s) for a duration (s). A table is interpolated linearly in log(duration) and
 * log(intensity) (IDF curves are close to straight on log-log paper); outside the table's range the
 * result is NaN, the caller reports it.
 */
export function intensity(curve: IdfCurve, duration: number): number {
  if (curve.kind === "formula") return curve.a / Math.pow(duration / 60 + curve.b, curve.c);
  const { durations, intensities } = curve;
  const last = durations.length - 1;
  const eps = 1e-9 * durations[last];
  if (duration < durations[0] - eps || duration > durations[last] + eps) return NaN;
  let i = 1;
  while (i < last && durations[i] < duration) i++;
  const x0 = Math.log(durations[i - 1]);
  const x1 = Math.log(durations[i]);
  const y0 = Math.log(intensities[i - 1]);
  const y1 = Math.log(intensities[i]);
  const x = Math.log(Math.min(Math.max(duration, durations[0]), durations[last]));
  return Math.exp(y0 + ((y1 - y0) * (x - x0)) / (x1 - x0));
}
