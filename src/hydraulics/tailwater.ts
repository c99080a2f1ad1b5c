// Downstream water level: free outfall, a constant elevation, or a channel rating (elevation by the
// pond's total outflow, linear between rows, held flat beyond the last row's slope-extended line).
import type { Tailwater } from "../model.js";

/** Tailwater elevation for a total outflow; -Infinity for a free outfall. */
export function tailwaterLevel(t: Tailwater, flow: number): number {
  switch (t.kind) {
    case "free":
      return -Infinity;
    case "elevation":
      return t.elevation;
    case "rating": {
      const q = t.flows;
      const z = t.elevations;
      const n = q.length;
      if (flow <= q[0]) return z[0];
      for (let i = 1; i < n; i++) {
        if (flow <= q[i]) return z[i - 1] + ((z[i] - z[i - 1]) * (flow - q[i - 1])) / (q[i] - q[i - 1]);
      }
      // Beyond the table: extend the last row's slope.
      return z[n - 1] + ((z[n - 1] - z[n - 2]) * (flow - q[n - 1])) / (q[n - 1] - q[n - 2]);
    }
  }
}
