// The design run's progress on stderr: on a terminal one line, cleared and rewritten in place and
// never wider than the terminal (at most 79 columns); otherwise a plain line every few seconds.
import type { Progress } from "../engine/run.js";

export interface ProgressStream {
  isTTY?: boolean;
  columns?: number;
  write(text: string): unknown;
}

export interface ProgressBudget {
  /** Routings (Infinity with a time budget). */
  routings: number;
  /** Seconds of a time budget. */
  seconds?: number;
}

/** Seconds between plain lines when stderr is not a terminal. */
export const PLAIN_INTERVAL = 5;
/** Seconds between rewrites of the terminal line. */
const TERMINAL_INTERVAL = 0.25;

export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return "-";
  const s = Math.max(0, Math.round(seconds));
  if (s < 60) return `${s}s`;
  if (s < 3600) return `${Math.floor(s / 60)}m${String(s % 60).padStart(2, "0")}s`;
  return `${Math.floor(s / 3600)}h${String(Math.floor((s % 3600) / 60)).padStart(2, "0")}m`;
}

/** The progress in words: share of the budget, routings per second, layouts, best cost, time left. */
export function progressText(p: Progress, budget: ProgressBudget): string {
  const share = budget.seconds !== undefined ? p.seconds / budget.seconds : p.routings / budget.routings;
  const rate = p.seconds > 0 ? p.routings / p.seconds : 0;
  const left = budget.seconds !== undefined ? budget.seconds - p.seconds : rate > 0 ? (budget.routings - p.routings) / rate : Infinity;
  const best = p.bestCost === null ? "none yet" : p.bestCost.toFixed(1);
  return `outfit: ${Math.min(100, Math.floor(share * 100))}% of budget, ${Math.round(rate)} routings/s, ${p.layoutsFitted} layouts, best cost ${best}, ${formatDuration(left)} left`;
}

export class ProgressReporter {
  private last = -Infinity;
  private shown = false;
  constructor(
    private readonly stream: ProgressStream,
    private readonly budget: ProgressBudget,
    private readonly now: () => number = () => performance.now() / 1000,
    private readonly plainInterval = PLAIN_INTERVAL,
  ) {}

  private get width(): number {
    return Math.min(79, (this.stream.columns ?? 80) - 1);
  }

  update(p: Progress): void {
    const t = this.now();
    const terminal = this.stream.isTTY === true;
    if (t - this.last < (terminal ? TERMINAL_INTERVAL : this.plainInterval)) return;
    this.last = t;
    const text = progressText(p, this.budget);
    if (terminal) {
      const line = text.length > this.width ? text.slice(0, this.width) : text.padEnd(this.width);
      this.stream.write(`\r${line}`);
      this.shown = true;
    } else this.stream.write(`${text}\n`);
  }

  /** Clears the terminal line (plain lines stay). */
  finish(): void {
    if (this.shown) this.stream.write(`\r${" ".repeat(this.width)}\r`);
    this.shown = false;
  }
}
