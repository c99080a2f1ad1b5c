// The estimate `pond` sizes to (the largest routed estimate and the catalogue allowance) against the
// storage routed compliant designs use: on every bundled case with a pond (the case's own outlet when
// it complies, else the search's best), and on the cases sized from a site (cases/site-only and the
// 24-hour NRCS storms of cases/site-groundwater), where `pond --write` then `design` must find a
// compliant outlet in the written pond without growing it.
import { describe, expect, it } from "vitest";
import { loadCase, parseCase, type LoadedCase } from "../../src/case/load.js";
import { routeCase, type CaseRouting } from "../../src/routing/routeCase.js";
import { assess } from "../../src/assess/assess.js";
import { caseEstimates, sizingEstimate } from "../../src/sizing/stormEstimates.js";
import { CATALOGUE_ALLOWANCE, choosePond } from "../../src/sizing/pondChoice.js";
import { pondCostWeights } from "../../src/sizing/pondCost.js";
import { sitePond } from "../../src/case/site.js";
import { pondFile } from "../../src/report/pondFile.js";
import { storageCurve } from "../../src/storage/curve.js";
import { storageBelow } from "../../src/storage/limitLevel.js";
import { caseLimitLevel } from "../../src/sizing/stormEstimates.js";
import { buildProblem } from "../../search/engine/problem.js";
import { runSearch } from "../../search/engine/run.js";
import type { Case } from "../../src/model.js";

/** The estimate `pond` sizes to in the case's pond (m3 above the pool), with the catalogue allowance. */
function sizedTo(c: Case): number {
  const e = sizingEstimate(caseEstimates(c, c.storms.map(() => ({ group: null, rational: null }))))!;
  return e.volume * (1 + CATALOGUE_ALLOWANCE);
}

/** The most storage (m3 above the pool) a routed design uses in any storm with a target. */
function used(c: Case, routing: CaseRouting): number {
  const pool = storageCurve(c.pond).volume(c.pond.pool);
  return Math.max(...routing.storms.filter((s) => s.storm.target !== null).map((s) => s.result.maxStorage - pool));
}

async function searched(loaded: LoadedCase, budget: number): Promise<CaseRouting | null> {
  const run = await runSearch(buildProblem(loaded.case, loaded.data, {}), { seed: "outfit", budget, top: 1, starts: 3, beam: 3 });
  return run.candidates.find((k) => k.assessment.compliant)?.routing ?? null;
}

/** A compliant routed design of the case: its own outlet when it complies, else the search's best. */
async function compliantDesign(loaded: LoadedCase): Promise<CaseRouting> {
  const c = loaded.case;
  if (c.outlet && (c.outlet.elements.length > 0 || c.outlet.riser)) {
    const own = routeCase(c, c.outlet);
    if (assess(c, own).compliant) return own;
  }
  // A short search first; the default budget where it finds nothing (cases/cipolletti).
  const found = (await searched(loaded, 3000)) ?? (await searched(loaded, 20000));
  expect(found, c.name).not.toBeNull();
  return found!;
}

/**
 * Measured (seed "outfit", 3000 routings where searched, 20000 for cipolletti; 4000 on the written
 * ponds): estimate with the allowance / storage used: cipolletti 1.12, demo 1.12, demo-rainfall 1.03, ordinance-mix 1.06, si-headwall 1.11,
 * si-wet-barrel 1.10, small-compliant 0.96 (its own outlet holds its 25-yr storm 4 % below the band's
 * middle), underground 1.19, wet-value 1.06, rational 1.22; the written ponds of site-only 1.04 and
 * site-groundwater (24-hour NRCS storms) 1.07. Without the allowance 0.84 to 1.06. The estimate is at
 * least the storage used, or within 5 % of it.
 */
const TOLERANCE = 0.05;

describe("the estimate pond sizes to brackets the storage routed compliant designs use", () => {
  // Every bundled case with a pond (cases/infeasible has no compliant design by construction).
  const bundled = ["cipolletti", "demo", "demo-rainfall", "ordinance-mix", "si-headwall", "si-wet-barrel", "small-compliant", "underground", "wet-value", "rational"];
  it.each(bundled)("%s", async (name) => {
    const loaded = loadCase(`cases/${name}/case.json`);
    const ratio = sizedTo(loaded.case) / used(loaded.case, await compliantDesign(loaded));
    console.log(`${name}: estimate with allowance / storage used = ${ratio.toFixed(3)}`);
    expect(ratio).toBeGreaterThanOrEqual(1 - TOLERANCE);
  }, 60_000);
});

describe("pond --write, then design: a compliant outlet in the written pond, not grown", () => {
  it.each(["site-only", "site-groundwater"])("%s", async (name) => {
    const loaded = loadCase(`cases/${name}/case.json`);
    const c = loaded.case;
    const choice = choosePond({ site: c.site!, criteria: c.criteria, spillway: c.outlet?.spillway, tailwater: c.tailwater, storms: c.storms, costs: pondCostWeights(c.units, c.costs) });
    expect(choice.chosen).not.toBeNull();
    // What `pond --write` writes: the case file with the chosen pond, read back as a user's file would be.
    const json = structuredClone(loaded.json) as Record<string, unknown>;
    json.pond = pondFile(sitePond(choice)!, c.units);
    const written = parseCase(json, { file: c.file });
    const routing = await searched(written, 4000);
    expect(routing, name).not.toBeNull();
    // The design fits the written pond: every storm below its own limit level, and the estimate
    // sized for it is at least what the design uses.
    const w = written.case;
    for (const s of routing!.storms) expect(s.result.maxStage).toBeLessThanOrEqual(caseLimitLevel(w, s.storm).level + 1e-9);
    const ratio = sizedTo(w) / used(w, routing!);
    console.log(`${name}: the written pond holds ${storageBelow(w.pond, caseLimitLevel(w, w.storms[w.storms.length - 1]).level).toFixed(0)} m3 below the largest storm's limit level; estimate with allowance / storage used = ${ratio.toFixed(3)}`);
    expect(ratio).toBeGreaterThanOrEqual(1 - TOLERANCE);
  }, 120_000);
});
