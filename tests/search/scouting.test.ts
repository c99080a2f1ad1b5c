// Scouting: in one thread, the most promising layout of each batch the first plan scores is fitted
// at once, so that a first compliant design is in hand before the whole plan is scored; the part
// that fits the layout later takes that very fit. The control is the same run with scouting off (a
// fitter that fits in this thread but says it has two workers, as worker pools do not scout): the
// same ranking, routings and journal entries, and a first compliant design found later. A shard's run
// (a batch job) does not scout.
import { describe, expect, it } from "vitest";
import { loadCase } from "../../src/case/load.js";
import { buildProblem } from "../../search/engine/problem.js";
import { runSearch, type JournalEntry } from "../../search/engine/run.js";
import { InlineFitter, type LayoutFitter } from "../../search/engine/fitter.js";
import { planning, scoreHere } from "../../search/engine/layouts.js";

/** Fits in this thread, counting the layouts it fits; reporting two workers, the run does not scout. */
function counting(inline: InlineFitter, workers: number): LayoutFitter & { jobs: number } {
  const f = {
    workers,
    taskSeconds: 0,
    jobs: 0,
    fit: (j: Parameters<LayoutFitter["fit"]>[0], d: Parameters<LayoutFitter["fit"]>[1], s: Parameters<LayoutFitter["fit"]>[2]) => {
      f.jobs += j.length;
      return inline.fit(j, d, s);
    },
    score: (c: Parameters<LayoutFitter["score"]>[0]) => inline.score(c),
    explain: (d: Parameters<LayoutFitter["explain"]>[0]) => inline.explain(d),
    close: () => inline.close(),
  };
  return f;
}

// On small-compliant the first layout scouted (2 x 3 in orifices and a 2 ft weir in a 3 ft riser, cost
// 16.2) is compliant but dearer than the designs the parts find first (12.81, within the buildability
// rules), so no part fits it: the scouted fit is dropped, and the run is still exactly the one without
// scouting. On the other two cases a part takes a scouted fit.
const CASES = [
  { name: "demo", taken: true },
  { name: "site-only", taken: true },
  { name: "small-compliant", taken: false },
];

describe("scouting while the first plan is scored", () => {
  for (const { name, taken } of CASES) {
    it(`${name}: a compliant design in hand before the plan is scored; the ranking, routings and journal of a run without scouting${taken ? "" : " (the scouted fit dropped)"}`, async () => {
      const loaded = loadCase(`cases/${name}/case.json`);
      const p = buildProblem(loaded.case, loaded.data, {});
      const settings = { seed: "outfit", starts: 3 };
      const options = { seed: "outfit", budget: 6000, top: 5, starts: 3, beam: 3 };
      const plan = scoreHere(p, planning(p, 3));
      const journals: JournalEntry[][] = [[], []];
      const scoutFitter = counting(new InlineFitter(p, settings), 1);
      const plainFitter = counting(new InlineFitter(p, settings), 2);
      const scouted = await runSearch(p, { ...options, fitter: scoutFitter, onLayout: (e) => journals[0].push(e) });
      const plain = await runSearch(p, { ...options, fitter: plainFitter, onLayout: (e) => journals[1].push(e) });
      // The parts took the scouted fits instead of fitting those layouts again (at most 3 scouts), or
      // fitted none of them (a dropped scout fits nothing twice either).
      if (taken) expect(scoutFitter.jobs).toBeLessThan(plainFitter.jobs);
      else expect(scoutFitter.jobs).toBe(plainFitter.jobs);
      expect(plainFitter.jobs - scoutFitter.jobs).toBeLessThanOrEqual(3);
      // Found while the plan was scored: fewer routings than the plan's own (the control's come after it).
      expect(scouted.routingsToFirstCompliant).not.toBeNull();
      expect(scouted.routingsToFirstCompliant!).toBeLessThan(plan.routings);
      expect(plain.routingsToFirstCompliant!).toBeGreaterThan(plan.routings);
      expect(scouted.routings).toBe(plain.routings);
      expect(scouted.layoutsFitted).toBe(plain.layoutsFitted);
      const ranking = (r: typeof plain) => r.candidates.map((c) => [JSON.stringify(c.file), c.cost, c.assessment.compliant]);
      expect(ranking(scouted)).toEqual(ranking(plain));
      const byKey = (js: JournalEntry[]) => [...js].sort((a, b) => a.key.localeCompare(b.key));
      expect(byKey(journals[0])).toEqual(byKey(journals[1]));
    }, 120_000);
  }

  it("a shard does not scout: its first compliant design comes after the plan (a scouted layout may be another shard's)", async () => {
    const loaded = loadCase("cases/demo/case.json");
    const p = buildProblem(loaded.case, loaded.data, {});
    const options = { seed: "outfit", budget: 6000, top: 5, starts: 3, beam: 3 };
    const plan = scoreHere(p, planning(p, 3));
    const whole = await runSearch(p, options);
    const shard = await runSearch(p, { ...options, shard: { index: 1, count: 1 } });
    expect(whole.routingsToFirstCompliant!).toBeLessThan(plan.routings);
    expect(shard.routingsToFirstCompliant!).toBeGreaterThan(plan.routings);
    expect(shard.candidates.map((c) => c.cost)).toEqual(whole.candidates.map((c) => c.cost));
  }, 120_000);
});
