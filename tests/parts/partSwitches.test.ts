// The outlet part is the unit of the code: nothing outside src/parts/ asks which kind of part it holds
// (design notes: "the rest of the library never switches on which projection it holds"). This scans
// src/ and search/ for comparisons of an element's, riser's or catalogue option's type, shape or kind
// with a kind's name, for `case` labels of them (a switch over kinds), and for lists of kinds, and fails on
// any outside src/parts/. The one exception named here: the barrel's section (a pipe or a box) in its
// HDS-5 hydraulics, which may compare a barrel's shape with "circular" or "box" and nothing else.
import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative, resolve } from "node:path";
import { describe, expect, it } from "vitest";

const ROOT = resolve(__dirname, "../..");

/** Every kind's type and shape names (the registry's and the riser's and barrel's). */
const NAMES = "orifice|weir|regulator|circular|rectangular|v-notch|cipolletti|box";

/** Files that may compare a barrel's section shape (and only that: "circular" or "box"). */
const BARREL_SECTION_KERNELS = ["src/hydraulics/barrel.ts", "src/hydraulics/barrelSection.ts", "src/hydraulics/normalDepth.ts", "src/hydraulics/criticalDepth.ts", "src/hydraulics/barrelCurve.ts"];

const PATTERNS: { what: string; pattern: RegExp }[] = [
  { what: "a type, shape or kind compared with a kind's name", pattern: new RegExp(`\\.(?:type|shape|kind)\\s*[!=]==?\\s*["'](${NAMES})["']`, "g") },
  { what: "a kind's name compared with a type, shape or kind", pattern: new RegExp(`["'](${NAMES})["']\\s*[!=]==?\\s*[\\w.?]+\\.(?:type|shape|kind)\\b`, "g") },
  { what: "a case label of a kind", pattern: new RegExp(`\\bcase\\s+["'](${NAMES})["']\\s*:`, "g") },
  { what: "a kind looked up in a list", pattern: new RegExp(`\\.includes\\(\\s*["'](${NAMES})["']\\s*\\)`, "g") },
  { what: "a loop over kinds", pattern: new RegExp(`\\bof\\s*\\[\\s*["'](${NAMES})["']`, "g") },
];

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? files(path) : path.endsWith(".ts") ? [path] : [];
  });
}

/** The code without comments (a comment may name kinds freely). */
function code(text: string): string {
  return text.replace(/\/\*[\s\S]*?\*\//g, "").replace(/(^|[^:"'`\\])\/\/.*$/gm, "$1");
}

/** Every match of the patterns in a text, as "path:line: what: the code". */
function partSwitches(path: string, text: string, barrelSection: boolean): string[] {
  const body = code(text);
  const found: string[] = [];
  for (const { what, pattern } of PATTERNS) {
    for (const m of body.matchAll(pattern)) {
      if (barrelSection && /\.shape\b/.test(m[0]) && /["'](circular|box)["']/.test(m[0])) continue;
      const line = body.slice(0, m.index).split("\n").length;
      found.push(`${path}:${line}: ${what}: ${m[0]}`);
    }
  }
  return found;
}

describe("part kinds are switched on only in src/parts/", () => {
  it("no switch on a part's kind in src/ or search/ outside src/parts/", () => {
    const scanned = [...files(join(ROOT, "src")), ...files(join(ROOT, "search"))].map((f) => relative(ROOT, f)).filter((f) => !f.startsWith("src/parts/"));
    expect(scanned.length).toBeGreaterThan(120);
    const found = scanned.flatMap((f) => partSwitches(f, readFileSync(join(ROOT, f), "utf8"), BARREL_SECTION_KERNELS.includes(f)));
    expect(found).toEqual([]);
  });

  it("the scan finds each form it looks for (planted), and lets a barrel kernel compare only the barrel's section", () => {
    const planted = [
      'const low = e.type === "weir" ? e.crest : e.invert;',
      'if ("v-notch" === part.kind) x();',
      'switch (e.type) {\n  case "orifice":\n    return 1;\n}',
      'if (cat.weirShapes.includes("cipolletti")) y();',
      'for (const kind of ["orifice", "rectangular"] as const) z(kind);',
      'const size = r.shape === "circular" ? r.diameter : r.length;',
    ].join("\n");
    expect(partSwitches("planted.ts", planted, false)).toHaveLength(6);
    expect(partSwitches("planted.ts", "// e.type === \"weir\" in a comment\n/* case \"weir\": */", false)).toEqual([]);
    expect(partSwitches("barrel.ts", 'const a = b.shape === "circular" ? 1 : 2;', true)).toEqual([]);
    expect(partSwitches("barrel.ts", 'const a = e.type === "weir" ? 1 : 2;', true)).toHaveLength(1);
  });
});
