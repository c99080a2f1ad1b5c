// Seeded random invented ponds for property checks of the router: every storage form, wet and dry
// ponds, and outlets drawn from orifices, weirs, a riser and a spillway. Deterministic for a seed.
import seedrandom from "seedrandom";

export interface RandomPond {
  /** A case file's JSON (SI). */
  json: Record<string, unknown>;
  /** What was drawn, printed when a check fails. */
  summary: string;
}

export function randomPonds(seed: string, count: number): RandomPond[] {
  const random = seedrandom(seed);
  const uniform = (a: number, b: number) => a + (b - a) * random();
  const logUniform = (a: number, b: number) => Math.exp(uniform(Math.log(a), Math.log(b)));
  const pick = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)];
  const round = (x: number, digits = 3) => Number(x.toFixed(digits));
  const ponds: RandomPond[] = [];
  for (let n = 0; n < count; n++) {
    const bottom = round(uniform(0, 100), 2);
    const depth = round(uniform(1, 6), 2);
    const top = round(bottom + depth, 2);
    const wet = random() < 0.3;
    const pool = wet ? round(bottom + uniform(0.2, 0.4) * depth, 2) : bottom;
    const area = logUniform(8, 8000);
    const kind = pick(["prismoid", "stageArea", "stageStorage"] as const);
    let storage: unknown;
    if (kind === "prismoid") {
      const width = Math.sqrt(area / 2);
      storage = { prismoid: { length: round(2 * width), width: round(width), sideSlope: round(uniform(0, 4), 1) } };
    } else {
      const rows: [number, number][] = [];
      let a = area;
      let v = 0;
      const step = depth / 4;
      for (let i = 0; i <= 4; i++) {
        const z = round(bottom + i * step, 3);
        rows.push([z, round(kind === "stageArea" ? a : v, 1)]);
        const next = a * uniform(1, 1.4);
        v += (step / 3) * (a + next + Math.sqrt(a * next));
        a = next;
      }
      storage = kind === "stageArea" ? { stageArea: rows } : { stageStorage: rows };
    }
    const elements: unknown[] = [{ type: "orifice", shape: "circular", diameter: round(logUniform(0.05, 0.8)), invert: pool }];
    if (random() < 0.3) {
      elements.push({ type: "orifice", shape: "rectangular", width: round(uniform(0.1, 0.6)), height: round(uniform(0.05, 0.3)), invert: round(pool + uniform(0.2, 0.5) * (top - pool), 3) });
    }
    if (random() < 0.3) elements.push({ type: "weir", shape: "v-notch", angle: pick([22.5, 45, 60, 90]), crest: round(pool + uniform(0.1, 0.6) * (top - pool), 3) });
    if (random() < 0.4) {
      elements.push({ type: "weir", shape: "rectangular", length: round(uniform(0.3, 3)), crest: round(pool + uniform(0.2, 0.8) * (top - pool), 3), endContractions: pick([0, 1, 2]) });
    }
    const outlet: Record<string, unknown> = { elements };
    if (random() < 0.3) outlet.riser = { shape: "circular", diameter: round(uniform(0.6, 1.8), 2), crest: round(pool + uniform(0.6, 0.85) * (top - pool), 3) };
    if (random() < 0.3) outlet.spillway = { crest: round(top - uniform(0.05, 0.2) * depth, 3), length: round(uniform(2, 10), 1), sideSlope: 3 };
    const peak = logUniform(0.002, 3);
    const rise = logUniform(3, 120);
    const shape = pick(["triangle", "two peaks"] as const);
    const series =
      shape === "triangle"
        ? [[0, 0], [round(rise, 2), round(peak, 4)], [round(rise * uniform(2, 6), 2), 0]]
        : [[0, 0], [round(rise, 2), round(0.6 * peak, 4)], [round(1.5 * rise, 2), round(0.3 * peak, 4)], [round(2.2 * rise, 2), round(peak, 4)], [round(5 * rise, 2), 0]];
    const json = {
      name: `random pond ${n} (invented)`,
      units: "SI",
      pond: { bottom, top, ...(wet ? { permanentPool: pool } : {}), storage },
      storms: [{ name: "storm", returnPeriod: 10, inflow: { series } }],
      outlet,
    };
    ponds.push({ json, summary: JSON.stringify(json) });
  }
  return ponds;
}
