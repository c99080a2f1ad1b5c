// What one kind of check is: how it is evaluated on a routed case, the slack the search keeps, and its
// words for tables and explanations. One file per rule in this folder; the registry lists them.
import type { Case, Outlet, Storm } from "../../model.js";
import type { StormRouting } from "../../routing/routeCase.js";
import { formatter } from "../../format.js";

/**
 * A rule's kind, e.g. "peak-upper" (stable: JSON `kind` and half of a check's `key`). A plain string so
 * that a new rule needs only its own file and a registry line; the registry test asserts uniqueness.
 */
export type CheckKind = string;

/** What a check's value and limit measure (how they are converted and printed): a length is a distance (ft / m), a size a small one (in / mm). */
export type Quantity = "flow" | "elevation" | "hours" | "size" | "length";

export interface Check {
  /** Stable identity: `${kind}:${storm}`; match checks by it, never by `name`. */
  key: string;
  name: string;
  kind: CheckKind;
  storm: string;
  /** Free-text source of the rule (e.g. an ordinance clause); null when the case gives none. */
  label: string | null;
  /** The outlet condition the check was evaluated on: "design" (as given) or "clogged" (criteria.clogging). */
  condition: "design" | "clogged";
  /**
   * Where a flow check measures its value when not at the pond's outlet: "point of analysis" (the pond's
   * outflow plus the storm's bypass) or a further point's name; null at the pond's outlet.
   */
  point: string | null;
  /** A system of ponds: the pond the check judges, or "outfall" for the flow reaching the outfall; absent for one pond. */
  pond?: string;
  passed: boolean;
  /** SI: m3/s for peaks, m (elevation) for stages, hours for drawdown, m for sizes; null when not reached. */
  value: number | null;
  limit: number;
  slack: number;
}

/**
 * A routing a rule needs: "design" is the outlet as given; a rule needing another (e.g. the principal
 * outlet removed) names it in `routings`, and checks.ts provides each variant some rule names.
 */
export type RoutingVariant = string;

/** The outlet a routing variant routes (null when the variant does not apply, e.g. no spillway). */
export type VariantOutlet = (c: Case, outlet: Outlet) => Outlet | null;

export interface RuleInput {
  case: Case;
  outlet: Outlet;
  /** Routed storms for each variant a rule declared in `routings`. */
  routings: Readonly<Record<RoutingVariant, readonly StormRouting[]>> & { readonly design: readonly StormRouting[] };
  /** Rules that rate the outlet themselves do it by the direct evaluation (the search's reference
   * path, `RatingOptions.direct`) instead of the rating sweep. */
  direct?: boolean;
  /** "clogged" when checks.ts evaluates the clogged twins (criteria.clogging); absent or "design" otherwise. */
  condition?: "design" | "clogged";
}

export interface Rule {
  kind: CheckKind;
  quantity: Quantity;
  /** "at most" for upper limits, "at least" for lower limits. */
  comparison: "at most" | "at least";
  routings: readonly RoutingVariant[];
  /** How each variant this rule names (other than "design") changes the outlet; checks.ts routes it once per candidate. */
  variants?: Readonly<Record<RoutingVariant, VariantOutlet>>;
  /** Appends this rule's checks (none when the case does not ask for it). */
  evaluate(input: RuleInput, out: Check[]): void;
  /**
   * Appends those of this rule's checks that can only get worse as openings are added (every added
   * opening adds flow at every stage) and need no routing but the design's (checks on storms not
   * routed are left out). The search evaluates them on a first level alone at the floor and drops
   * the option when one fails: no layout starting with it can comply. Absent: no such checks.
   */
  boundFirstLevel?(input: RuleInput, out: Check[]): void;
  /**
   * Judges the outlet as built (where its holes are, what its parts can carry), not a storm's routing:
   * its checks are not evaluated again with the openings clogged (clogging changes the routing, not
   * the structure).
   */
  asBuilt?: boolean;
  /** Slack the search must keep on a check of this rule (the aim), given the search's margin. */
  aim(c: Case, check: Check, margin: number): number;
  /** Why a check of this rule binds, in words. */
  why(check: Check): string;
  /** What relaxes it when no single elevation step does. */
  remedy(check: Check): string;
  /** Short subject for "how the value moved" text (e.g. "2-yr peak"). */
  subject(check: Check): string;
  /**
   * Why no design tried meets this rule, in one sentence, when a search finds nothing compliant and
   * this rule fails in its closest candidates (null: nothing to add). Rules that share a cause return
   * the same sentence; it is said once.
   */
  whyNothingComplies(input: InfeasibleInput): string | null;
}

/** What a rule is told when no design complies: its failing checks in the closest candidates. */
export interface InfeasibleInput {
  case: Case;
  /** This rule's failing checks in the closest candidates (at least one). */
  failing: readonly Check[];
  /** The closest candidates' routed storms (the design as given), one list per candidate. */
  closest: readonly (readonly StormRouting[])[];
  /** Whether no opening passed the search's first-level bound (the search then says why peaks fail itself). */
  firstLevelBound: boolean;
}

/** The storms (or subjects) of failing checks, once each, in words: "2-yr and 10-yr". */
export function failingSubjects(failing: readonly Check[]): string {
  const names = [...new Set(failing.map((c) => c.storm))];
  return names.length <= 1 ? names.join("") : `${names.slice(0, -1).join(", ")} and ${names[names.length - 1]}`;
}

/** Whether a slack passes: edges count as inside, with a tolerance for round-off. */
export const PASS_TOLERANCE = 1e-12;

export function makeCheck(kind: CheckKind, storm: string, name: string, value: number | null, limit: number, slack: number, label: string | null = null): Check {
  return { key: checkKey(kind, storm), name, kind, storm, label, condition: "design", point: null, passed: slack >= -PASS_TOLERANCE, value, limit, slack };
}

export function checkKey(kind: CheckKind, storm: string): string {
  return `${kind}:${storm}`;
}

/** The words and place of a storm's peak checks: at the point of analysis when it has a bypass. */
export const POINT_OF_ANALYSIS = "point of analysis";

/** " at the point of analysis" for a storm with a bypass, else nothing: for check names. */
export function atPointWords(storm: Storm): string {
  return storm.bypass ? ` at the ${POINT_OF_ANALYSIS}` : "";
}

/** Slack of an upper limit measured on depths above a datum (elevation checks). */
export function depthSlack(value: number, limit: number, datum: number): number {
  const limitDepth = Math.max(limit - datum, 1e-9);
  return (limitDepth - (value - datum)) / limitDepth;
}

/** Slack of an upper limit on a flow, as a fraction of the limit. */
export function upperFlowSlack(value: number, limit: number): number {
  return limit > 0 ? (limit - value) / limit : value > 0 ? -1 : 0;
}

/** Slack of a lower limit on a flow, as a fraction of the limit. */
export function lowerFlowSlack(value: number, limit: number): number {
  return (value - limit) / limit;
}

/** Default slack other rules keep in the search: a hair inside the limit. */
export const HAIR = 0.002;

/** What relaxes a stage limit when no single elevation step does (freeboard, spillway, overtopping). */
export const HIGH_STAGE_REMEDY = "no single elevation step helps; larger openings near the top, a wider riser or barrel, or more storage";

/** The storm the freeboard applies to: the criteria's, else the largest storm with a target. */
export function freeboardStorm(c: Case): Storm | undefined {
  let largest: Storm | undefined;
  for (const s of c.storms) if (s.target !== null && (largest === undefined || s.returnPeriod >= largest.returnPeriod)) largest = s;
  return c.storms.find((s) => s.name === c.criteria.freeboardStorm) ?? largest;
}

/** The lowest maximum stage any of the routings reaches in a storm (Infinity when none routes it). */
export function closestMaxStage(closest: readonly (readonly StormRouting[])[], storm: Storm | undefined): number {
  return Math.min(...closest.map((storms) => storms.find((s) => s.storm.name === storm?.name)?.result.maxStage ?? Infinity));
}

/**
 * Why nothing keeps the freeboard storm low enough (freeboard and overtopping share it): the lowest
 * maximum stage the closest candidates reach in that storm (the largest storm with a target when the
 * criteria name none).
 */
export function highStageInfeasible({ case: c, closest }: InfeasibleInput): string {
  const f = formatter(c.units);
  const storm = freeboardStorm(c);
  const best = closestMaxStage(closest, storm);
  return (
    `The ${storm?.name} storm cannot be kept ${f.length(c.criteria.freeboardDepth)} below the top of embankment (${f.elevation(c.pond.top)}) ` +
    `together with the other rules: the closest candidate still reaches ${f.elevation(best)}. Allow larger openings or a wider riser, a larger barrel, or add storage.`
  );
}
