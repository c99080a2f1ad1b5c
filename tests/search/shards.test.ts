// Shards: how the parts of a search are dealt to `--shard k/n` runs (search/engine/partition.ts,
// `shardOf`), and what a shard's run leaves to the gather. The dealing is a property over every count
// of parts and shards a run can have; on a bundled case, n shards gathered give exactly one run's
// ranking (and its explanations and baseline, which the shards leave to the gather).
import { describe, expect, it } from "vitest";
import { loadCase } from "../../src/case/load.js";
import { buildProblem } from "../../search/engine/problem.js";
import { MAX_PARTS, inShard, shardOf } from "../../search/engine/partition.js";
import { RELAX_WHEN_GATHERED, runSearch, type JournalEntry, type SearchRun } from "../../search/engine/run.js";
import type { ScoreOutcome } from "../../search/engine/scoring.js";

/** The parts (from 0) each shard (from 0) runs. */
function shares(parts: number, shards: number): number[][] {
  const out: number[][] = Array.from({ length: shards }, () => []);
  for (let part = 0; part < parts; part++) out[shardOf(part, parts, shards)].push(part);
  return out;
}

describe("dealing the parts to shards", () => {
  it("puts every part in exactly one shard, the shares within one part of each other, for 1 to 16 parts and shards", () => {
    for (let parts = 1; parts <= MAX_PARTS; parts++) {
      for (let shards = 1; shards <= 16; shards++) {
        for (let part = 0; part < parts; part++) {
          const holders = Array.from({ length: shards }, (_, k) => k).filter((k) => inShard(part, parts, { index: k + 1, count: shards }));
          expect(holders, `part ${part} of ${parts}, ${shards} shards`).toEqual([shardOf(part, parts, shards)]);
        }
        const sizes = shares(parts, shards).map((s) => s.length);
        expect(sizes.reduce((a, b) => a + b, 0)).toBe(parts);
        expect(Math.max(...sizes) - Math.min(...sizes), `${parts} parts, ${shards} shards: ${sizes}`).toBeLessThanOrEqual(1);
      }
    }
  });

  it("gives the shard of the first (most promising) part no extra part, and each shard the same sum of ranks over pairs of rounds", () => {
    for (let parts = 1; parts <= MAX_PARTS; parts++) {
      for (let shards = 2; shards <= 16; shards++) {
        const dealt = shares(parts, shards);
        const first = dealt[shardOf(0, parts, shards)].length;
        // With fewer parts than shards, shard k runs part k and the others none.
        if (parts < shards) expect(dealt.map((s) => s.length)).toEqual(Array.from({ length: shards }, (_, k) => (k < parts ? 1 : 0)));
        else expect(first, `${parts} parts, ${shards} shards`).toBe(Math.min(...dealt.map((s) => s.length)));
        // An even number of whole rounds: every shard holds parts whose places in the order of promise add
        // up alike (a round forward, the next back). Dealt in turn (part % n), shard 1 would hold the
        // first of every round.
        const rounds = Math.floor(parts / shards);
        if (rounds >= 2 && rounds % 2 === 0 && parts % shards === 0) {
          const sums = dealt.map((s) => s.reduce((a, b) => a + b, 0));
          expect(new Set(sums).size, `${parts} parts, ${shards} shards: ${sums}`).toBe(1);
        }
      }
    }
    // Worked by hand: 16 parts in 2 shards, then in 3 (the sixteenth part, left over, to the last shard).
    expect(shares(16, 2)).toEqual([
      [0, 3, 4, 7, 8, 11, 12, 15],
      [1, 2, 5, 6, 9, 10, 13, 14],
    ]);
    expect(shares(16, 3)).toEqual([
      [0, 5, 6, 11, 12],
      [1, 4, 7, 10, 13],
      [2, 3, 8, 9, 14, 15],
    ]);
    expect(shares(7, 3)).toEqual([[0, 5], [1, 4], [2, 3, 6]]);
  });
});

describe("shards gathered on a bundled case", () => {
  const loaded = loadCase("cases/demo/case.json");
  const problem = buildProblem(loaded.case, loaded.data);
  // 30,000 routings: six parts, so two shards run three each and three shards two each.
  const options = { seed: "shards", budget: 30_000, top: 5, starts: 3, beam: 3 };
  const ranking = (r: SearchRun) => r.candidates.map((c) => `${JSON.stringify(c.file)} ${c.cost}`);
  const shown = (r: SearchRun) => r.candidates.slice(0, options.top);
  let single: { run: SearchRun; keys: string[] } | undefined;
  const one = async () => {
    if (!single) {
      const keys: string[] = [];
      const run = await runSearch(problem, { ...options, onLayout: (e) => keys.push(e.key) });
      single = { run, keys };
    }
    return single;
  };

  for (const count of [2, 3]) {
    it(`${count} shards: together the single run's layouts, gathered its ranking; each leaves the baseline, the moves and the spread to the gather`, async () => {
      const { run, keys } = await one();
      expect(run.parts).toBe(6);
      expect(run.baseline).not.toBeNull();
      const done = new Map<string, JournalEntry>();
      const screens = new Map<string, ScoreOutcome>();
      const held: string[][] = [];
      for (let index = 1; index <= count; index++) {
        const own: string[] = [];
        const shard = await runSearch(problem, {
          ...options,
          shard: { index, count },
          onLayout: (e) => {
            own.push(e.key);
            done.set(e.key, e);
          },
          onScreen: (key, outcome) => screens.set(key, outcome),
        });
        held.push(own);
        expect(shard.partsRun).toBe(6 / count);
        // What only the gathered ranking needs is left to the gather: the existing outlet, the moves
        // that relax each binding check (the check and why are given), the spread.
        expect(shard.baseline).toBeNull();
        expect(shard.candidates.length).toBeGreaterThan(0);
        for (const c of shown(shard)) {
          expect(c.spread).toBeNull();
          expect(c.explanation[0]).toMatch(/^binding: /);
          expect(c.explanation[1]).toMatch(/^why: /);
          expect(c.explanation.slice(2)).toEqual([RELAX_WHEN_GATHERED]);
        }
      }
      // The shares do not overlap, and together they are the single run's layouts.
      expect(new Set(held.flat()).size).toBe(held.flat().length);
      for (const own of held) expect(own.length).toBeGreaterThan(0);
      expect([...held.flat()].sort()).toEqual([...keys].sort());
      const gathered = await runSearch(problem, { ...options, done, screens });
      expect(gathered.layoutsFromJournal).toBe(gathered.layoutsFitted);
      expect(gathered.routingsFromJournal).toBe(gathered.routings);
      expect(ranking(gathered)).toEqual(ranking(run));
      // The gather explains, routes the spread and assesses the existing outlet as the single run does.
      expect(shown(gathered).map((c) => c.explanation)).toEqual(shown(run).map((c) => c.explanation));
      expect(shown(gathered).some((c) => c.explanation.some((line) => line.startsWith("relax: ") && line !== RELAX_WHEN_GATHERED))).toBe(true);
      expect(shown(gathered).map((c) => c.spread?.reserve)).toEqual(shown(run).map((c) => c.spread?.reserve));
      expect(shown(gathered).every((c) => c.spread !== null)).toBe(true);
      expect(gathered.baseline?.explanation).toEqual(run.baseline!.explanation);
    }, 300_000);
  }
});
