// The case's criteria as checks with value, limit and slack (case-format contract): slack is how far
// a check is from failing as a fraction of its limit, on flows for flow checks and on depths above
// pond.bottom for elevation checks; negative when the check fails.
import type { Case, Outlet } from "../case/model.js";
import type { StormRouting } from "../routing/routeCase.js";

export type CheckKind = "peak-upper" | "peak-lower" | "freeboard" | "spillway-dry" | "drawdown" | "overtopping";

export interface Check {
  name: string;
  kind: CheckKind;
  storm: string;
  passed: boolean;
  /** SI: m3/s for peaks, m (elevation) for stages, hours for drawdown; null when not reached. */
  value: number | null;
  limit: number;
  slack: number;
}

/** Slack of an upper limit measured on depths above a datum (elevation checks). */
function depthSlack(value: number, limit: number, datum: number): number {
  const limitDepth = Math.max(limit - datum, 1e-9);
  return (limitDepth - (value - datum)) / limitDepth;
}

export function evaluateChecks(c: Case, outlet: Outlet, storms: readonly StormRouting[]): Check[] {
  const checks: Check[] = [];
  const bottom = c.pond.bottom;
  const { over, under } = c.criteria;
  for (const { storm, result } of storms) {
    if (storm.target === null) continue;
    const upper = storm.target * (1 + over);
    const peak = result.peakOutflow;
    const upperSlack = upper > 0 ? (upper - peak) / upper : peak > 0 ? -1 : 0;
    checks.push({
      name: `${storm.name} peak within upper band`,
      kind: "peak-upper",
      storm: storm.name,
      passed: upperSlack >= -1e-12,
      value: peak,
      limit: upper,
      slack: upperSlack,
    });
    const lower = storm.target * (1 - under);
    if (lower > 0) {
      const lowerSlack = (peak - lower) / lower;
      checks.push({
        name: `${storm.name} peak within lower band`,
        kind: "peak-lower",
        storm: storm.name,
        passed: lowerSlack >= -1e-12,
        value: peak,
        limit: lower,
        slack: lowerSlack,
      });
    }
  }
  const freeboard = storms.find((s) => s.storm.name === c.criteria.freeboardStorm);
  if (freeboard) {
    const limit = c.pond.top - c.criteria.freeboardDepth;
    const slack = depthSlack(freeboard.result.maxStage, limit, bottom);
    checks.push({
      name: `${freeboard.storm.name} freeboard`,
      kind: "freeboard",
      storm: freeboard.storm.name,
      passed: slack >= -1e-12,
      value: freeboard.result.maxStage,
      limit,
      slack,
    });
  }
  if (outlet.spillway) {
    for (const { storm, result } of storms) {
      if (storm.returnPeriod > c.criteria.spillwayDryThrough) continue;
      const slack = depthSlack(result.maxStage, outlet.spillway.crest, bottom);
      checks.push({
        name: `${storm.name} spillway dry`,
        kind: "spillway-dry",
        storm: storm.name,
        passed: slack >= -1e-12,
        value: result.maxStage,
        limit: outlet.spillway.crest,
        slack,
      });
    }
  }
  const hours = c.criteria.drawdownHours;
  if (hours !== null) {
    for (const { storm, result } of storms) {
      const value = result.drawdownTime === null ? null : result.drawdownTime / 3600;
      const slack = value === null ? -1 : (hours - value) / hours;
      checks.push({
        name: `${storm.name} drawdown`,
        kind: "drawdown",
        storm: storm.name,
        passed: slack >= -1e-12,
        value,
        limit: hours,
        slack,
      });
    }
  }
  for (const { storm, result } of storms) {
    const slack = depthSlack(result.maxStage, c.pond.top, bottom);
    checks.push({
      name: `${storm.name} no overtopping`,
      kind: "overtopping",
      storm: storm.name,
      passed: slack >= -1e-12,
      value: result.maxStage,
      limit: c.pond.top,
      slack,
    });
  }
  return checks;
}

/** The check with the least slack. */
export function bindingCheck(checks: readonly Check[]): Check | undefined {
  let best: Check | undefined;
  for (const check of checks) if (!best || check.slack < best.slack) best = check;
  return best;
}
