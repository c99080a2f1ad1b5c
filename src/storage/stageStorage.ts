// Stage-storage table: cumulative volume linear between rows; above the last row the storage grows
// with the last interval's area (vertical walls), as the case-format contract states.

export function stageStorageVolume(elevations: readonly number[], volumes: readonly number[], stage: number): number {
  const n = elevations.length;
  if (stage <= elevations[0]) return volumes[0];
  for (let i = 1; i < n; i++) {
    if (stage <= elevations[i]) {
      return volumes[i - 1] + ((volumes[i] - volumes[i - 1]) * (stage - elevations[i - 1])) / (elevations[i] - elevations[i - 1]);
    }
  }
  return volumes[n - 1] + lastArea(elevations, volumes) * (stage - elevations[n - 1]);
}

/** Plan area implied by the table (slope of the volume), for the interval holding `stage`. */
export function stageStorageArea(elevations: readonly number[], volumes: readonly number[], stage: number): number {
  const n = elevations.length;
  for (let i = 1; i < n; i++) {
    if (stage <= elevations[i]) return (volumes[i] - volumes[i - 1]) / (elevations[i] - elevations[i - 1]);
  }
  return lastArea(elevations, volumes);
}

function lastArea(elevations: readonly number[], volumes: readonly number[]): number {
  const n = elevations.length;
  return (volumes[n - 1] - volumes[n - 2]) / (elevations[n - 1] - elevations[n - 2]);
}
