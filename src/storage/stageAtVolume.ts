// The stage at which a pond holds a volume above its permanent pool (or floor), by bisection on the
// storage curve (storage never falls with stage). Above a pond's top the walls are vertical, so any
// volume has a stage; an underground system holds nothing above its top unless the case declares it,
// so a volume beyond what it can hold has none (Infinity).
import type { Pond } from "../model.js";
import { storageCurve } from "./curve.js";

export function stageAtVolume(pond: Pond, volumeAbovePool: number): number {
  const curve = storageCurve(pond);
  const wanted = curve.volume(pond.pool) + volumeAbovePool;
  let low = pond.pool;
  let high = pond.top;
  for (let i = 0; i < 60 && curve.volume(high) < wanted; i++) high += pond.top - pond.bottom;
  if (curve.volume(high) < wanted) return Infinity;
  for (let i = 0; i < 100 && high - low > 1e-9 * (1 + Math.abs(high)); i++) {
    const mid = 0.5 * (low + high);
    if (curve.volume(mid) < wanted) low = mid;
    else high = mid;
  }
  return 0.5 * (low + high);
}
