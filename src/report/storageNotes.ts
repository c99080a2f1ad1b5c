// What the storage did in each routed storm, where the case has something to say about it: the water
// exfiltrated (and the time to drain), how high the water stood above an underground system's top and
// where it would appear, and the storm duration that governs a modified rational storm. A table for
// the console and fields for the JSON.
import type { Case } from "../model.js";
import type { CaseRouting, StormRouting } from "../routing/routeCase.js";
import { formatter } from "../format.js";
import { hydrologyUnits, toCaseUnits } from "../units.js";
import { surchargeAt, systemTop } from "../storage/underground.js";
import { renderTable, wrap, type Column, type Layout, type Row } from "./terminal.js";

/** Where the water stands at a stage above an underground system's top, in words ("" when not above it). */
export function surchargeWhere(c: Case, stage: number): string {
  const s = c.pond.storage;
  if (s.kind !== "underground") return "";
  const f = formatter(c.units);
  const at = surchargeAt(s, stage);
  if (at.height <= 0) return "";
  if (at.sealed) return `nothing is declared above the system's top: the water is pressed up to the head the outlet needs and would leave the system wherever it can reach the surface`;
  if (at.atSurface.length > 0) {
    const lowest = at.atSurface[0];
    const names = at.atSurface.map((x) => `${x.name} (rim ${f.elevation(x.rim)})`).join(", ");
    if (s.ponding) return `at the surface through ${names}; ponding ${f.length(at.pondingDepth)} deep`;
    return `at the surface through ${names}: ${f.length(stage - lowest.rim)} above ${lowest.name}'s rim`;
  }
  const names = at.inStructures.map((x) => x.name).join(", ");
  return `in ${names}, ${f.length(at.inStructures[0].rim - stage)} below the lowest rim`;
}

/** Whether the case has anything for the storage table. */
function hasNotes(c: Case, routing: CaseRouting): boolean {
  return c.pond.exfiltration !== undefined || c.pond.storage.kind === "underground" || routing.storms.some((s) => s.result.governingDuration !== undefined);
}

/** The storage table below the per-storm table, or null when the case has nothing for it. */
export function storageTable(c: Case, routing: CaseRouting, layout: Layout): string | null {
  if (!hasNotes(c, routing)) return null;
  const f = formatter(c.units);
  const L = f.labels;
  const durations = routing.storms.some((s) => s.result.governingDuration !== undefined);
  const x = c.pond.exfiltration;
  const s = c.pond.storage;
  const underground = s.kind === "underground";
  const columns: Column[] = [
    { head: "Storm" },
    { head: `Max storage\n(${L.volume})`, align: "right" },
    ...(durations ? [{ head: "Governing\nduration (min)", align: "right" as const, unit: "min", label: "governing duration" }] : []),
    ...(x
      ? [
          { head: `Exfiltrated\n(${L.volume})`, align: "right" as const, narrow: "detail" as const },
          { head: `Peak exfiltration\n(${L.flow})`, align: "right" as const, narrow: "detail" as const },
        ]
      : []),
    ...(underground ? [{ head: `Above system top\n(${L.length})`, align: "right" as const, label: "above the system's top" }, { head: "Where the water stands", narrow: "detail" as const, label: "where" }] : []),
  ];
  const rows: Row[] = routing.storms.map(({ storm, result }) => {
    const height = underground ? Math.max(0, result.maxStage - systemTop(s)) : 0;
    return [
      storm.name,
      f.raw.volume(result.maxStorage).toLocaleString("en-US", { maximumFractionDigits: 0 }),
      ...(durations ? [result.governingDuration === undefined ? "-" : (result.governingDuration / 60).toFixed(0)] : []),
      ...(x ? [Math.round(f.raw.volume(result.volumeExfiltrated)).toLocaleString("en-US"), f.raw.flow(result.peakExfiltration).toPrecision(3)] : []),
      ...(underground ? [{ text: f.raw.length(height).toFixed(2), tone: height > 0 ? ("fail" as const) : undefined }, height > 0 ? surchargeWhere(c, result.maxStage) : "below the top"] : []),
    ];
  });
  const lines = ["Storage:", renderTable(layout, columns, rows).text];
  const notes: string[] = [];
  if (durations) notes.push("Governing duration: the modified rational storm duration that raises the pond highest (every duration from Tc to well past the critical one is routed).");
  const h = hydrologyUnits(c.units);
  if (x) notes.push(`Exfiltration: ${Number(h.intensity(x.rate).toPrecision(3))} ${h.labels.intensity} over the wetted bottom${x.sides ? " and sides" : ""}; the drain time is the drawdown column above (limit ${x.drainHours} h).`);
  if (underground) notes.push(`System top ${f.elevation(systemTop(s))}: above it only the declared structures${s.ponding ? " and surface ponding" : ""} hold water${s.structures.length === 0 && !s.ponding ? " (none is declared)" : ""}.`);
  return [...lines, ...notes.map((note) => wrap(note, layout.width))].join("\n");
}

/** The storage fields of a storm in `route --json` (present only where they apply; in case units). */
export function storageJsonFields(c: Case, sr: StormRouting): Record<string, number | string> {
  const u = toCaseUnits(c.units);
  const r = sr.result;
  const fields: Record<string, number | string> = {};
  if (r.governingDuration !== undefined) {
    fields.governingDuration = r.governingDuration / 60;
    fields.durationsRouted = r.durationsRouted ?? 1;
  }
  if (c.pond.exfiltration) {
    fields.volumeExfiltrated = u.volume(r.volumeExfiltrated);
    fields.peakExfiltration = u.flow(r.peakExfiltration);
  }
  const s = c.pond.storage;
  if (s.kind === "underground") {
    fields.aboveSystemTop = u.length(Math.max(0, r.maxStage - systemTop(s)));
    fields.surchargeWhere = surchargeWhere(c, r.maxStage) || "below the system's top";
  }
  return fields;
}

/** One line of storage notes for a routed outlet (a candidate's list): governing durations, exfiltration, surcharge; none when nothing applies. */
export function storageSummary(c: Case, routing: CaseRouting): string[] {
  const f = formatter(c.units);
  const lines: string[] = [];
  const ranged = routing.storms.filter((s) => s.result.governingDuration !== undefined);
  if (ranged.length) lines.push(`governing duration: ${ranged.map((s) => `${s.storm.name} ${(s.result.governingDuration! / 60).toFixed(0)} min`).join(", ")}`);
  if (c.pond.exfiltration) lines.push(`exfiltrated: ${routing.storms.map((s) => `${s.storm.name} ${f.volume(s.result.volumeExfiltrated)}`).join(", ")}`);
  const s = c.pond.storage;
  if (s.kind === "underground") {
    const above = routing.storms.filter((x) => x.result.maxStage > systemTop(s));
    if (above.length) lines.push(`above the system's top: ${above.map((x) => `${x.storm.name} ${f.length(x.result.maxStage - systemTop(s))} (${surchargeWhere(c, x.result.maxStage)})`).join("; ")}`);
  }
  return lines;
}
