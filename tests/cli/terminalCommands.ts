// The commands the pseudo-terminal tests run on every bundled case: each command where the case
// allows it (route, rate, report and drawing need an outlet, pond and --size-pond a site, hydrograph a
// hydrology section, design a catalogue; the report of each design run), the writers' messages, and
// the help of every command.
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { ROOT } from "./run.js";

/** The terminal widths every command is held to. */
export const WIDTHS = [80, 120] as const;

export interface TerminalCommand {
  /** What the test is called. */
  label: string;
  /** The arguments; "<tmp>" is replaced by a fresh directory for what the command writes. */
  args: string[];
  /** Exit codes that are answers, not failures (1: no pond fits, for instance). */
  codes: number[];
  /** Whether its output holds a table or verdict that a colour terminal shows in colour. */
  coloured: boolean;
  /** Commands run after it in the same "<tmp>" (the report of a design run), held to the same. */
  then?: string[][];
}

interface CaseFile {
  outlet?: unknown;
  ponds?: unknown;
  catalogue?: unknown;
  site?: unknown;
  hydrology?: unknown;
}

/** The bundled cases, by folder name. */
export function bundledCases(): string[] {
  return readdirSync(join(ROOT, "cases")).filter((name) => !name.startsWith(".")).sort();
}

function caseFile(name: string): CaseFile {
  return JSON.parse(readFileSync(join(ROOT, "cases", name, "case.json"), "utf8")) as CaseFile;
}

/** Every estimate and check command on every bundled case where it applies. */
export function caseCommands(): TerminalCommand[] {
  return bundledCases().flatMap((name) => {
    const path = `cases/${name}/case.json`;
    const file = caseFile(name);
    const commands: TerminalCommand[] = [];
    const withOutlet = file.outlet !== undefined || file.ponds !== undefined;
    if (withOutlet) {
      commands.push({ label: `route ${name}`, args: ["route", path], codes: [0], coloured: true });
      commands.push({ label: `rate ${name}`, args: ["rate", path], codes: [0], coloured: true });
      commands.push({ label: `report ${name}`, args: ["report", path, "--out", "<tmp>/report.html"], codes: [0], coloured: false });
      // A system of ponds draws each pond's outlet into a directory.
      commands.push({ label: `drawing ${name}`, args: ["drawing", path, "--out", file.ponds ? "<tmp>" : "<tmp>/outlet.svg"], codes: [0], coloured: false });
    }
    commands.push({ label: `volume ${name}`, args: ["volume", path, "--type", "II"], codes: [0], coloured: true });
    if (file.site !== undefined) commands.push({ label: `pond ${name}`, args: ["pond", path, "--type", "II"], codes: [0, 1], coloured: true });
    if (file.hydrology !== undefined) commands.push({ label: `hydrograph ${name}`, args: ["hydrograph", path, "--out", "<tmp>"], codes: [0], coloured: true });
    return commands;
  });
}

/** design (with --out, so its written files are named too) on every case with a catalogue, and --size-pond where a site allows. */
export function designCommands(): TerminalCommand[] {
  return bundledCases().flatMap((name) => {
    const path = `cases/${name}/case.json`;
    const file = caseFile(name);
    const commands: TerminalCommand[] = [];
    if (file.catalogue !== undefined) {
      commands.push({ label: `design ${name}`, args: ["design", path, "--budget", "300", "--top", "3", "--out", "<tmp>"], codes: [0], coloured: true, then: [["report", "<tmp>"]] });
    }
    if (file.site !== undefined && file.catalogue !== undefined) {
      commands.push({ label: `design --size-pond ${name}`, args: ["design", path, "--size-pond", "--budget", "300", "--top", "2", "--out", "<tmp>"], codes: [0], coloured: true });
    }
    return commands;
  });
}

/** The help of outfit and of each command, and the commands that only write a file and say so. */
export function otherCommands(): TerminalCommand[] {
  const commands = ["route", "rate", "design", "gather", "hydrograph", "volume", "pond", "report", "drawing", "schema", "starter"];
  return [
    { label: "outfit --help", args: ["--help"], codes: [0], coloured: false },
    ...commands.map((command) => ({ label: `${command} --help`, args: [command, "--help"], codes: [0], coloured: false })),
    { label: "starter", args: ["starter", "<tmp>/my-pond.json"], codes: [0], coloured: false },
    { label: "starter --units SI", args: ["starter", "<tmp>/my-pond-si.json", "--units", "SI"], codes: [0], coloured: false },
    { label: "schema --out", args: ["schema", "--out", "<tmp>/case.schema.json"], codes: [0], coloured: false },
  ];
}
