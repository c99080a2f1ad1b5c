// The layering of the code (design notes, DEVELOPERS.md "Layout"): no physics file imports the case
// file's schema or its loading; every folder stands on a floor and imports only from the floors below
// it (and its own), so no two folders import each other; and no import cycle among the files of src/
// and search/.
import { readdirSync, readFileSync, statSync } from "node:fs";
import { dirname, join, relative, resolve } from "node:path";
import { describe, expect, it } from "vitest";

const ROOT = resolve(__dirname, "../..");
const SRC = join(ROOT, "src");
const SEARCH = join(ROOT, "search");

/**
 * The floors, ground first: a room (a folder of src/ or of search/, or a file directly in src/) imports only
 * rooms of its own floor or of a floor below. case/ stands above the parts and the physics because it
 * builds the case file's schema from the parts' fragments and normalizes through them; io.ts above
 * case/ because its errors are the loader's `CaseError`.
 */
const FLOORS: readonly (readonly string[])[] = [
  ["src/own", "src/units", "src/model", "src/fields", "src/format", "src/terminalText"],
  ["src/hydrology"],
  ["src/storage"],
  ["src/parts"],
  ["src/hydraulics"],
  ["src/routing"],
  ["src/sizing"],
  ["src/assess"],
  ["src/case"],
  ["src/report"],
  ["src/io"],
  ["src/commands"],
  ["search/engine"],
  ["search/parallel"],
  ["search/pond"],
  ["search/report"],
  ["search/command"],
  ["src/cli"],
];

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? files(path) : path.endsWith(".ts") ? [path] : [];
  });
}

function imports(file: string): string[] {
  const text = readFileSync(file, "utf8");
  const found = [...text.matchAll(/(?:import|export)[^"']*?from\s+["'](\.[^"']+)["']/g)].map((m) => m[1]);
  return found.map((spec) => resolve(dirname(file), spec.replace(/\.js$/, ".ts")));
}

/** The room a file belongs to: "src/parts" for src/parts/x.ts, "src/units" for src/units.ts, "search/engine" for search/engine/**. */
function room(file: string): string {
  const parts = relative(ROOT, file).split("/");
  if (parts[0] === "search") return `search/${parts[1]}`;
  return `src/${parts[1].replace(/\.ts$/, "")}`;
}

/** Cycles of a directed graph (each reported once, from where the walk entered it). */
function cycles(graph: Map<string, string[]>, name: (node: string) => string): string[] {
  const state = new Map<string, "open" | "done">();
  const found: string[] = [];
  const visit = (node: string, path: string[]) => {
    if (state.get(node) === "done") return;
    if (state.get(node) === "open") {
      found.push([...path.slice(path.indexOf(node)), node].map(name).join(" -> "));
      return;
    }
    state.set(node, "open");
    for (const next of graph.get(node) ?? []) visit(next, [...path, node]);
    state.set(node, "done");
  };
  for (const node of graph.keys()) visit(node, []);
  return found;
}

const all = [...files(SRC), ...files(SEARCH)];

describe("layers", () => {
  it("no physics file imports case/ (the SI model types live on the ground floor, src/model.ts)", () => {
    const physics = ["parts", "hydraulics", "storage", "routing", "hydrology"].flatMap((d) => files(join(SRC, d)));
    expect(physics.length).toBeGreaterThan(20);
    const offending = physics.flatMap((f) =>
      imports(f)
        .filter((target) => relative(SRC, target).startsWith("case"))
        .map((target) => `${relative(SRC, f)} -> ${relative(SRC, target)}`),
    );
    expect(offending).toEqual([]);
  });

  it("src/ and search/ have no import cycle among their files", () => {
    const graph = new Map(all.map((f) => [f, imports(f)]));
    expect(cycles(graph, (f) => relative(ROOT, f))).toEqual([]);
  });

  it("no cycle between folders (rooms)", () => {
    const graph = new Map<string, string[]>();
    for (const f of all) {
      const from = room(f);
      const targets = graph.get(from) ?? [];
      for (const target of imports(f).map(room)) if (target !== from && !targets.includes(target)) targets.push(target);
      graph.set(from, targets);
    }
    expect(cycles(graph, (r) => r)).toEqual([]);
  });

  it("every room stands on a floor and imports only from its own floor or the floors below", () => {
    const floorOf = new Map(FLOORS.flatMap((rooms, i) => rooms.map((r) => [r, i] as const)));
    expect([...new Set(all.map(room))].filter((r) => !floorOf.has(r))).toEqual([]);
    const upwards = all.flatMap((f) =>
      imports(f)
        .filter((target) => floorOf.get(room(target))! > floorOf.get(room(f))!)
        .map((target) => `${relative(ROOT, f)} -> ${relative(ROOT, target)}`),
    );
    expect(upwards).toEqual([]);
  });

  it("the checks above find what they look for (a control: the cycle walk on a planted circle)", () => {
    const graph = new Map([["a", ["b"]], ["b", ["c"]], ["c", ["a"]], ["d", ["a"]]]);
    expect(cycles(graph, (n) => n)).toEqual(["a -> b -> c -> a"]);
  });
});
