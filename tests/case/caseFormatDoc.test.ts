// The case format's documentation and JSON Schema stay in step with the zod schema (issue 11):
// every field of the schema is described in docs/case-format.md, docs/case.schema.json is exactly
// what `outfit schema` generates, and the bundled cases name it and load.
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { caseSchema } from "../../src/case/schema.js";
import { caseJsonSchema } from "../../src/case/jsonSchema.js";
import { loadCase } from "../../src/case/load.js";
import { outfit } from "../cli/run.js";

/** Every property name of a JSON Schema, at any depth. */
function propertyNames(schema: unknown, into = new Set<string>()): Set<string> {
  if (Array.isArray(schema)) schema.forEach((s) => propertyNames(s, into));
  else if (schema && typeof schema === "object") {
    const properties = (schema as { properties?: Record<string, unknown> }).properties;
    if (properties) for (const key of Object.keys(properties)) into.add(key);
    for (const value of Object.values(schema)) propertyNames(value, into);
  }
  return into;
}

describe("docs/case-format.md and the JSON Schema", () => {
  const doc = readFileSync("docs/case-format.md", "utf8");
  const names = propertyNames(z.toJSONSchema(caseSchema, { io: "input", unrepresentable: "any" }));

  it("the schema has the fields the contract names (a sanity floor for the walk below)", () => {
    for (const field of ["pond", "permanentPool", "stageArea", "dryThrough", "orificeCoefficient", "elevationStep"]) expect(names.has(field), field).toBe(true);
  });
  it("every field of the schema appears in backticks in docs/case-format.md", () => {
    const missing = [...names].filter((name) => !new RegExp("`[^`\\n]*(?<![\\w$])" + name.replace(/\$/g, "\\$") + "(?![\\w])[^`\\n]*`").test(doc));
    expect(missing).toEqual([]);
  });
  it("docs/case.schema.json is what `outfit schema` prints, and that is generated from the zod schema", () => {
    const printed = outfit("schema");
    expect(printed.status).toBe(0);
    expect(JSON.parse(printed.stdout)).toEqual(caseJsonSchema());
    expect(JSON.parse(readFileSync("docs/case.schema.json", "utf8"))).toEqual(caseJsonSchema());
    expect(caseJsonSchema().properties).toEqual((z.toJSONSchema(caseSchema, { io: "input", unrepresentable: "any" }) as { properties: unknown }).properties);
  });
  it("every bundled case names the schema in $schema and loads with it", () => {
    for (const name of readdirSync("cases")) {
      const file = join("cases", name, "case.json");
      const json = JSON.parse(readFileSync(file, "utf8")) as { $schema?: string };
      expect(json.$schema, file).toBe("../../docs/case.schema.json");
      expect(loadCase(file).notices.filter((n) => n.includes("$schema")), file).toEqual([]);
    }
  });
});
