// Prismoidal pond: rectangular floor L x W, side slopes z:1. Exact volume at depth d above the floor:
// V = L W d + (L + W) z d^2 + (4/3) z^2 d^3 (HEC-22 eq 8-7; the case-format contract).

export function prismoidVolume(length: number, width: number, sideSlope: number, depth: number): number {
  if (depth <= 0) return 0;
  const z = sideSlope;
  return length * width * depth + (length + width) * z * depth * depth + (4 / 3) * z * z * depth * depth * depth;
}

/** Water-surface area at depth d: (L + 2 z d)(W + 2 z d). */
export function prismoidArea(length: number, width: number, sideSlope: number, depth: number): number {
  const d = Math.max(depth, 0);
  return (length + 2 * sideSlope * d) * (width + 2 * sideSlope * d);
}
