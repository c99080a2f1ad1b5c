// The layering of the code (design notes): no physics file imports the case file's schema or its
// loading, and no import cycle among src/ files.
import { readdirSync, readFileSync, statSync } from "node:fs";
import { dirname, join, relative, resolve } from "node:path";
import { describe, expect, it } from "vitest";

const SRC = resolve(__dirname, "../../src");

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

describe("layers", () => {
  it("no physics file imports case/ (the SI model types live on the ground floor, src/model.ts)", () => {
    const physics = ["hydraulics", "storage", "routing", "hydrology"].flatMap((d) => files(join(SRC, d)));
    expect(physics.length).toBeGreaterThan(20);
    const offending = physics.flatMap((f) =>
      imports(f)
        .filter((target) => relative(SRC, target).startsWith("case"))
        .map((target) => `${relative(SRC, f)} -> ${relative(SRC, target)}`),
    );
    expect(offending).toEqual([]);
  });

  it("src/ has no import cycle", () => {
    const graph = new Map(files(SRC).map((f) => [f, imports(f)]));
    const state = new Map<string, "open" | "done">();
    const cycles: string[] = [];
    const visit = (f: string, path: string[]) => {
      if (state.get(f) === "done") return;
      if (state.get(f) === "open") {
        cycles.push([...path.slice(path.indexOf(f)), f].map((x) => relative(SRC, x)).join(" -> "));
        return;
      }
      state.set(f, "open");
      for (const next of graph.get(f) ?? []) visit(next, [...path, f]);
      state.set(f, "done");
    };
    for (const f of graph.keys()) visit(f, []);
    expect(cycles).toEqual([]);
  });
});
