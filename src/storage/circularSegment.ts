// The part-full circle, exactly. For radius r and water depth y (0 <= y <= 2r) measured from the invert:
//   area     A(y) = r^2 acos((r - y)/r) - (r - y) sqrt(2 r y - y^2)      (the circular segment)
//   width    T(y) = 2 sqrt(y (2r - y))                                    (the chord at the surface)
// and, for a pipe laid on a slope, the depth integral of the area, in u = y - r:
//   G(y) = r^2 u acos(-u/r) + r^2 sqrt(r^2 - u^2) - (1/3)(r^2 - u^2)^(3/2)   (G(0) = 0, G(2r) = pi r^3)
// (integration by parts of A; the segment formula is in any hydraulics text, e.g. Chow, Open-Channel
// Hydraulics (1959) Table 2-1).

/** Wetted area (m2) of a circle of diameter D at depth y above its invert. */
export function segmentArea(diameter: number, depth: number): number {
  const r = diameter / 2;
  if (depth <= 0) return 0;
  if (depth >= diameter) return Math.PI * r * r;
  const u = depth - r;
  return r * r * Math.acos(-u / r) + u * Math.sqrt(r * r - u * u);
}

/** Surface width (m) of a circle of diameter D at depth y. */
export function segmentWidth(diameter: number, depth: number): number {
  if (depth <= 0 || depth >= diameter) return 0;
  return 2 * Math.sqrt(depth * (diameter - depth));
}

/** Integral of the wetted area over depth from 0 to y (m3 per unit of length along a unit slope). */
export function segmentAreaIntegral(diameter: number, depth: number): number {
  const r = diameter / 2;
  if (depth <= 0) return 0;
  if (depth >= diameter) return Math.PI * r * r * r + Math.PI * r * r * (depth - diameter);
  const u = depth - r;
  const s = r * r - u * u;
  return r * r * u * Math.acos(-u / r) + r * r * Math.sqrt(s) - (s * Math.sqrt(s)) / 3;
}
