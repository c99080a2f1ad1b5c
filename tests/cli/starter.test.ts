// `outfit starter` writes a case file that routes and designs as written, in US and SI units, with
// its comment fields ignored (no notices) and the caution kept.
import { describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { outfit } from "./run.js";
import { CAUTION } from "../../src/report/caution.js";

describe.each(["US", "SI"])("outfit starter --units %s", (units) => {
  it("writes a commented case that routes and designs with exit 0", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-starter-"));
    try {
      const file = join(dir, "pond.json");
      const written = outfit("starter", file, "--units", units);
      expect(written.status).toBe(0);
      const json = JSON.parse(readFileSync(file, "utf8")) as Record<string, unknown>;
      expect(json.units).toBe(units);
      expect(String(json["//"])).toContain(CAUTION);
      // Every section carries a comment.
      for (const key of ["//units", "//storms", "//tailwater", "//project"]) expect(typeof json[key]).toBe("string");
      for (const key of ["pond", "criteria", "outlet", "catalogue"]) expect(typeof (json[key] as Record<string, unknown>)["//"]).toBe("string");

      const route = outfit("route", file, "--json");
      expect(route.status).toBe(0);
      expect(route.stderr).toBe("");
      const routed = JSON.parse(route.stdout) as { storms: { massBalanceError: number }[] };
      expect(routed.storms).toHaveLength(3);
      for (const s of routed.storms) expect(Math.abs(s.massBalanceError)).toBeLessThan(1e-4);

      const design = outfit("design", file, "--budget", "1500", "--top", "1");
      expect(design.status).toBe(0);
      expect(design.stdout).toContain("Candidate 1:");

      // An existing file is not overwritten without --force (exit 2, file unchanged).
      const again = outfit("starter", file, "--units", units);
      expect(again.status).toBe(2);
      expect(again.stderr).toContain("--force");
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
