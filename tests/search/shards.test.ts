// Shards: how the parts of a search are dealt to `--shard k/n` runs (search/engine/partition.ts,
// `shardOf`): a property over every count of parts and shards a run can have.
import { describe, expect, it } from "vitest";
import { MAX_PARTS, inShard, shardOf } from "../../search/engine/partition.js";

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
