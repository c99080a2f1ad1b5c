// Stage-area table: area linear in elevation inside a row interval; the volume of an interval is the
// conic (frustum) formula dh/3 (A1 + A2 + sqrt(A1 A2)) (HEC-22 sec. 8.3, frustum), to a partial depth
// with the interpolated area there. Above the last row the walls are vertical.

/** Volume between elevations[0] and `stage`. */
export function stageAreaVolume(elevations: readonly number[], areas: readonly number[], stage: number): number {
  let volume = 0;
  const n = elevations.length;
  if (stage <= elevations[0]) return 0;
  for (let i = 1; i < n; i++) {
    const z0 = elevations[i - 1];
    const z1 = elevations[i];
    const a0 = areas[i - 1];
    if (stage <= z1) {
      const a = a0 + ((areas[i] - a0) * (stage - z0)) / (z1 - z0);
      return volume + frustum(a0, a, stage - z0);
    }
    volume += frustum(a0, areas[i], z1 - z0);
  }
  return volume + areas[n - 1] * (stage - elevations[n - 1]);
}

export function stageAreaArea(elevations: readonly number[], areas: readonly number[], stage: number): number {
  const n = elevations.length;
  if (stage <= elevations[0]) return areas[0];
  for (let i = 1; i < n; i++) {
    if (stage <= elevations[i]) {
      return areas[i - 1] + ((areas[i] - areas[i - 1]) * (stage - elevations[i - 1])) / (elevations[i] - elevations[i - 1]);
    }
  }
  return areas[n - 1];
}

function frustum(a1: number, a2: number, depth: number): number {
  return (depth / 3) * (a1 + a2 + Math.sqrt(a1 * a2));
}
