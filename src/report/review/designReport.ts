// The review report of a design run: the candidates compared with the binding constraint of each
// and its explanation, then every candidate routed again from its own case file.
import type { Case } from "../../model.js";
import { formatter, significant, trimNumber } from "../../format.js";
import { CAUTION } from "../caution.js";
import { percent, slackText, warningCount } from "../console.js";
import { withinBand } from "../json.js";
import { toCaseUnits } from "../../units.js";
import { candidatesChart } from "./figures.js";
import { cautionSection, methodsSection, optional, outletSections, storageSection, type ReportInputs, type RoutedOutlet } from "./caseReport.js";
import { hydrologySection } from "./hydrology.js";
import { projectFacts } from "./project.js";
import { caseFacts, stormsTable, verdictNote } from "./tables.js";
import type { DesignRun, LoadedCandidate } from "./designRun.js";
import { FigureCounter, section, type Block, type Cell, type NoteBlock, type ReportDocument, type Section, type TableBlock } from "./model.js";

export interface RoutedCandidate extends RoutedOutlet {
  candidate: LoadedCandidate;
}

/** Relative difference of peaks and difference of stages above which the reported and re-routed results disagree. */
const PEAK_AGREEMENT = 0.005;
const STAGE_AGREEMENT = { US: 0.01, SI: 0.003 } as const;

/** Where the design run's reported storms differ from routing its candidate again. */
export function disagreements(c: Case, routed: RoutedCandidate): string[] {
  const u = toCaseUnits(c.units);
  const f = formatter(c.units);
  const out: string[] = [];
  for (const { storm, result } of routed.routing.storms) {
    const reported = routed.candidate.reported.storms.find((s) => s.name === storm.name);
    if (!reported) {
      out.push(`${storm.name}: not in the design run's results`);
      continue;
    }
    const peak = u.flow(result.peakOutflow);
    if (Math.abs(reported.peakOutflow - peak) > PEAK_AGREEMENT * Math.max(Math.abs(peak), 1e-9)) {
      out.push(`${storm.name}: peak outflow reported ${significant(reported.peakOutflow)} ${f.labels.flow}, routed again ${f.flow(result.peakOutflow)}`);
    }
    if (Math.abs(reported.maxStage - u.length(result.maxStage)) > STAGE_AGREEMENT[c.units]) {
      out.push(`${storm.name}: maximum stage reported ${reported.maxStage.toFixed(3)} ${f.labels.length}, routed again ${f.elevation(result.maxStage)}`);
    }
  }
  return out;
}

function comparisonTable(c: Case, routed: readonly RoutedCandidate[]): TableBlock {
  const f = formatter(c.units);
  const targeted = c.storms.filter((s) => s.target !== null);
  return {
    kind: "table",
    caption: "Candidates, best first (peak outflow as a percentage of the target, at the point of analysis where a storm has a bypass; maximum stage over all storms)",
    head: ["Rank", "Description", ...targeted.map((s) => `${s.name} ${s.bypass ? "point" : "out"} / target`), "Max stage", "Cost", "Binding check", "Compliant"],
    numeric: [true, false, ...targeted.map(() => true), true, true, false, false],
    rows: routed.map((r) => {
      const reported = r.candidate.reported;
      const ratios = targeted.map((storm): Cell => {
        const s = r.routing.storms.find((x) => x.storm.name === storm.name)!;
        const inBand = withinBand(c, s.result.peakAtPoint, storm.target)!;
        return { text: percent(s.result.peakAtPoint / storm.target!), tone: inBand ? "pass" : "fail" };
      });
      const maxStage = Math.max(...r.routing.storms.map((s) => s.result.maxStage));
      const b = r.assessment.binding;
      const binding = b ? `${b.name}, slack ${slackText(c.units, b)}` : "none";
      return [
        `#${reported.rank}`,
        reported.description,
        ...ratios,
        f.elevation(maxStage),
        reported.cost === null || reported.cost === undefined ? "not given" : `${trimNumber(reported.cost, 2)} cost units`,
        binding,
        yes(reported.compliant, reported.warnings),
      ];
    }),
  };
}

/** Whether a design complies, its warnings beside the answer ("yes, 2 warnings"). */
function yes(compliant: boolean, warnings: readonly unknown[] = []): Cell {
  return { text: `${compliant ? "yes" : "no"}${warningCount({ warnings })}`, tone: compliant ? "pass" : "fail" };
}

/** "2.40 cost units (12.0 %)"; negative when the alternative costs more. */
function savingText(saving: { cost: number; percent: number | null }): string {
  return `${trimNumber(saving.cost, 2)} cost units${saving.percent === null ? "" : ` (${saving.percent.toFixed(1)} %)`}`;
}

/**
 * Value engineering: the existing outlet as row 0 (as the design run routed and assessed it) and
 * each alternative's saving against it, then the existing outlet's explanation and the run's verdict.
 */
function baselineBlocks(run: DesignRun, routed: readonly RoutedCandidate[]): Block[] {
  const b = run.results.baseline;
  if (!b) return [];
  const targeted = b.storms.filter((s) => s.target !== null);
  const binding = (k: { binding: { name: string; slack: number } | null }) => (k.binding ? `${k.binding.name}, slack ${percent(k.binding.slack)}` : "none");
  const table: TableBlock = {
    kind: "table",
    caption: "Against the existing outlet (row 0: the case's outlet as given; saving: its cost proxy less the alternative's)",
    head: ["Row", "Description", ...targeted.map((s) => `${s.name} ${s.peakAtPoint === undefined ? "out" : "point"} / target`), "Cost", "Saving", "Changes", "Binding check", "Compliant"],
    numeric: [true, false, ...targeted.map(() => true), true, true, true, false, false],
    rows: [
      ["0 (existing)", b.description, ...targeted.map((s) => percent((s.peakAtPoint ?? s.peakOutflow) / s.target!)), `${trimNumber(b.cost, 2)} cost units`, "-", "-", binding(b), yes(b.compliant, b.warnings)],
      ...routed.map((r) => {
        const k = r.candidate.reported;
        const ratios = targeted.map((s) => {
          const own = k.storms.find((x) => x.name === s.name);
          return own ? percent((own.peakAtPoint ?? own.peakOutflow) / s.target!) : "-";
        });
        return [`#${k.rank}`, k.description, ...ratios, k.cost === null || k.cost === undefined ? "not given" : `${trimNumber(k.cost, 2)} cost units`, k.saving ? savingText(k.saving) : "not given", k.changes ? String(k.changes.length) : "not given", binding(k), yes(k.compliant, k.warnings)];
      }),
    ],
  };
  return [table, { kind: "text", text: `Existing outlet: ${b.description}` }, { kind: "list", items: [...b.explanation, b.verdict] }];
}

function explanationBlocks(c: Case, r: RoutedCandidate): Block[] {
  const blocks: Block[] = [];
  const reported = r.candidate.reported;
  blocks.push({ kind: "text", text: `Candidate ${reported.rank}: ${reported.description}` });
  blocks.push(reported.explanation.length ? { kind: "list", items: reported.explanation } : { kind: "text", text: "The design run gave no explanation." });
  if (reported.saving && reported.changes) {
    blocks.push({ kind: "text", text: `Against the existing outlet: saving ${savingText(reported.saving)}; ${reported.changes.length ? "changes:" : "no change (the existing outlet itself)."}` });
    if (reported.changes.length) blocks.push({ kind: "list", items: reported.changes.map((change) => change.text) });
  }
  const differences = disagreements(c, r);
  if (differences.length) {
    blocks.push({ kind: "note", tone: "warning", text: `Routed again from ${reported.caseFile}, this candidate does not match the design run's results: ${differences.join("; ")}.` });
  }
  return blocks;
}

/** The run's facts: case, files, candidates (in `candidates`' words), why it stopped, its effort. */
function runFacts(run: DesignRun, candidates: string): Block {
  const s = run.results.search;
  return {
    kind: "facts",
    rows: [
      ["Case", run.results.case],
      ["Input case file", run.results.caseFile],
      ["Results directory", run.directory],
      ["Candidates", candidates],
      ["Search stopped because", s.stoppedBecause],
      ["Search effort", `${s.layouts} layouts, ${s.routings} routings, ${trimNumber(s.seconds, 1)} s, seed ${String(s.seed)}`],
      ...(s.shard ? [["Shard", shardFact(s.shard, s.leftToGather ?? [])] as [string, string]] : []),
    ],
  };
}

/** A shard's run in the facts: an intermediate result, and what outfit gather adds (`search.leftToGather`). */
function shardFact(shard: string, left: readonly string[]): string {
  const words: Record<string, string> = { baseline: "the existing outlet routed and assessed", relax: "the moves that relax each candidate's binding check", spread: "each candidate's spread" };
  const added = left.map((key) => words[key] ?? key);
  const list = added.length > 1 ? `${added.slice(0, -1).join(", ")} and ${added[added.length - 1]}` : added.join("");
  return `${shard} of a divided search: an intermediate result, ranked among its own parts alone; outfit gather with every shard's results directory gives the ranking of one run${list ? ` and adds ${list}` : ""}.`;
}

export function designReport(run: DesignRun, routed: readonly RoutedCandidate[], inputs: ReportInputs): ReportDocument {
  const figures = new FigureCounter();
  const best = routed[0];
  const c = best.candidate.case;
  const compared = section("candidates", "Candidates compared", [
    comparisonTable(c, routed),
    ...baselineBlocks(run, routed),
    figures.figure("candidates", "Candidates compared", "Total rating of each candidate against stage; hatched: each storm's target band, named above it; open markers: each candidate's routed peak (at the point of analysis where a storm has a bypass) at its maximum stage, beside that storm's band.",
      (id) => candidatesChart(id, c, routed.map((r) => ({ rank: r.candidate.reported.rank, outlet: r.outlet, storms: r.routing.storms })))),
  ], routed.map((r) => section(`candidate-${r.candidate.reported.rank}-why`, `Why candidate ${r.candidate.reported.rank}`, explanationBlocks(c, r))));
  // Built in the order they are shown, so that figures are numbered in document order.
  const storage = storageSection(c, best.outlet, figures, best.routing, inputs.estimates);
  const candidateSections: Section[] = routed.map((r) => {
    const rank = r.candidate.reported.rank;
    const prefix = `c${rank}-`;
    return section(`candidate-${rank}`, `Candidate ${rank}`, [
      { kind: "text", text: `${r.candidate.reported.description} (case file ${r.candidate.reported.caseFile}).` },
      verdictNote(c, r.assessment),
    ], outletSections(c, r, figures, inputs, prefix, r === best
      ? { full: true }
      : { full: false, note: `The stage-storage-discharge and hydrograph tables of candidate ${rank} are in its own report: outfit report ${r.candidate.reported.caseFile} (those of candidate ${best.candidate.reported.rank}, the first, are in this one).` }));
  });
  const verdict: NoteBlock = { ...verdictNote(c, best.assessment) };
  verdict.text = `Candidate ${best.candidate.reported.rank}: ${verdict.text}`;
  return {
    title: `Design report: ${run.results.case}`,
    subtitle: `Design run in ${run.directory}: ${routed.length} candidate${routed.length === 1 ? "" : "s"}, each routed again from its own case file by outfit.`,
    verdict,
    project: projectFacts(inputs.project, inputs.run),
    caution: CAUTION,
    sections: [
      section("run", "Design run", [runFacts(run, `${routed.length}, best first`)]),
      compared,
      section("summary", "Case", [caseFacts(c), stormsTable(c)]),
      ...optional(hydrologySection(c, inputs.hydrology ?? null)),
      storage,
      ...candidateSections,
      methodsSection(c, routed.map((r) => r.outlet), inputs.hydrology ?? null),
      cautionSection(),
    ],
  };
}

/**
 * The review report of a design run on a system of ponds: the run, the candidates compared (each
 * routed again from its own case file, the ponds together), the existing system where the run had
 * one, why each candidate binds, then the first candidate's own system report (`best`: its ponds,
 * their outlets and drawings, every storm, the checks); the other candidates' are their own reports.
 */
export function systemDesignReport(run: DesignRun, routed: readonly RoutedCandidate[], best: ReportDocument, inputs: ReportInputs): ReportDocument {
  const c = routed[0].candidate.case;
  const others = routed.slice(1).map((r) => r.candidate.reported.caseFile);
  const compared = section("candidates", "Candidates compared", [
    { ...comparisonTable(c, routed), caption: "Candidates, best first (the flow reaching the outfall as a percentage of the target, at the point of analysis where a storm has a bypass; maximum stage of the pond at the outfall)" },
    // The baseline is the existing system: every pond's outlet as the case gives it.
    ...baselineBlocks(run, routed).map((b) => JSON.parse(JSON.stringify(b).replaceAll("existing outlet", "existing system").replaceAll("the case's outlet as given", "every pond's outlet as the case gives it")) as Block),
    ...(others.length ? [{ kind: "text" as const, text: `The first candidate's system follows in full; each other candidate's is its own report: ${others.map((file) => `outfit report ${file}`).join(", ")}.` }] : []),
  ], routed.map((r) => section(`candidate-${r.candidate.reported.rank}-why`, `Why candidate ${r.candidate.reported.rank}`, explanationBlocks(c, r))));
  const verdict: NoteBlock = { ...verdictNote(c, routed[0].assessment) };
  verdict.text = `Candidate ${routed[0].candidate.reported.rank}: ${verdict.text}`;
  return {
    title: `Design report: ${run.results.case}`,
    subtitle: `Design run on a system of ponds in ${run.directory}: ${routed.length} candidate${routed.length === 1 ? "" : "s"}, each routed again from its own case file by outfit.`,
    verdict,
    project: projectFacts(inputs.project, inputs.run),
    caution: CAUTION,
    sections: [section("run", "Design run", [runFacts(run, `${routed.length}, best first (each a system of ${c.system!.ponds.length} ponds designed together)`)]), compared, ...best.sections.map((x) => (x.id === "summary" ? { ...x, title: `Candidate ${routed[0].candidate.reported.rank}: ${x.title.toLowerCase()}` } : x))],
  };
}

