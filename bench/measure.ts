// Timing and memory helpers shared by the bench sections. Figures are printed, never asserted.
import { setFlagsFromString } from "node:v8";
import { runInNewContext } from "node:vm";

export interface Timing {
  /** Fastest round's seconds per call (the least disturbed by other work on the machine). */
  seconds: number;
  /** Median round's seconds per call. */
  median: number;
  calls: number;
}

/**
 * Times `body` (one call = one unit of work): a warm-up, then rounds of enough calls to last about
 * `roundSeconds` each. The fastest round and the median round are reported: on a shared machine
 * the fastest is the cost of the code, the distance to the median is the disturbance.
 */
export function time(body: () => void, options: { rounds?: number; roundSeconds?: number } = {}): Timing {
  const rounds = options.rounds ?? 7;
  const roundSeconds = options.roundSeconds ?? 0.2;
  let calls = 1;
  for (;;) {
    const t0 = process.hrtime.bigint();
    for (let i = 0; i < calls; i++) body();
    const elapsed = Number(process.hrtime.bigint() - t0) / 1e9;
    if (elapsed > roundSeconds / 4) {
      calls = Math.max(1, Math.round((calls * roundSeconds) / elapsed));
      break;
    }
    calls *= 2;
  }
  const perCall: number[] = [];
  for (let r = 0; r < rounds; r++) {
    const t0 = process.hrtime.bigint();
    for (let i = 0; i < calls; i++) body();
    perCall.push(Number(process.hrtime.bigint() - t0) / 1e9 / calls);
  }
  perCall.sort((a, b) => a - b);
  return { seconds: perCall[0], median: perCall[Math.floor(rounds / 2)], calls };
}

/** Processor time of this process (user and system, all its threads) in seconds. */
function cpuSeconds(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1e6;
}

export interface Comparison {
  /** Processor seconds per call of each body: the fastest round's and the median round's. */
  a: { fastest: number; median: number };
  b: { fastest: number; median: number };
  /** a / b in each round, sorted: its median, least and most. */
  ratio: { median: number; least: number; most: number };
}

/**
 * Compares the cost of two bodies by the processor time this process spends on each, in rounds that
 * alternate between them (so both meet the same load from other work on a shared machine), each
 * round about `roundSeconds` of the slower. Processor time, not wall time: on a machine whose cores
 * other work holds, wall time counts the waits; the median ratio of the rounds is the figure.
 */
export function compare(a: () => void, b: () => void, options: { rounds?: number; roundSeconds?: number } = {}): Comparison {
  const rounds = options.rounds ?? 9;
  const roundSeconds = options.roundSeconds ?? 0.3;
  const perCall = (body: () => void, calls: number) => {
    const t0 = cpuSeconds();
    for (let i = 0; i < calls; i++) body();
    return (cpuSeconds() - t0) / calls;
  };
  // Warm-up, and the calls per round.
  const callsFor = (body: () => void) => {
    let calls = 1;
    for (;;) {
      const t = perCall(body, calls) * calls;
      if (t > roundSeconds / 4) return Math.max(1, Math.round((calls * roundSeconds) / t));
      calls *= 2;
    }
  };
  const ca = callsFor(a);
  const cb = callsFor(b);
  const ta: number[] = [];
  const tb: number[] = [];
  const ratios: number[] = [];
  for (let r = 0; r < rounds; r++) {
    const x = perCall(a, ca);
    const y = perCall(b, cb);
    ta.push(x);
    tb.push(y);
    ratios.push(x / y);
  }
  const sorted = (v: number[]) => [...v].sort((p, q) => p - q);
  const median = (v: number[]) => sorted(v)[Math.floor(v.length / 2)];
  return {
    a: { fastest: sorted(ta)[0], median: median(ta) },
    b: { fastest: sorted(tb)[0], median: median(tb) },
    ratio: { median: median(ratios), least: sorted(ratios)[0], most: sorted(ratios)[ratios.length - 1] },
  };
}

let collector: (() => void) | undefined;
/** A full garbage collection (exposed at run time, so `npm run bench` needs no node flag). */
export function collectGarbage(): void {
  if (!collector) {
    setFlagsFromString("--expose-gc");
    collector = runInNewContext("gc") as () => void;
  }
  collector();
}

/** Heap in use after a full collection (bytes). */
export function heapUsed(): number {
  collectGarbage();
  return process.memoryUsage().heapUsed;
}

export function formatNumber(x: number, digits = 3): string {
  if (x === 0 || !Number.isFinite(x)) return String(x);
  const magnitude = Math.floor(Math.log10(Math.abs(x)));
  return x.toFixed(Math.max(0, digits - 1 - magnitude));
}

/** "15.8 ns (median 17.2)" for a per-step or per-call figure in nanoseconds. */
export function nanoseconds(best: number, median: number): string {
  return `${formatNumber(best)} ns (median of the rounds ${formatNumber(median)})`;
}

export function megabytes(bytes: number): string {
  return `${(bytes / 1048576).toFixed(2)} MB`;
}

/** Prints aligned "label  value" rows under a heading. */
export function report(heading: string, rows: [string, string][]): void {
  const width = Math.max(...rows.map((r) => r[0].length));
  process.stdout.write(`\n${heading}\n`);
  for (const [label, value] of rows) process.stdout.write(`  ${label.padEnd(width)}  ${value}\n`);
}

/** A `design --json` ranking as text, to compare two runs: each candidate's design (a system's: its
 * ponds' outlets) and cost. */
export function rankingText(candidates: readonly { outlet?: unknown; ponds?: unknown; cost: number }[]): string {
  return JSON.stringify(candidates.map((c) => [c.outlet ?? c.ponds, c.cost]));
}
