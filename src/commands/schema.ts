// `outfit schema`: prints the case file's JSON Schema (generated from the zod schema).
import { caseJsonSchema } from "../case/jsonSchema.js";
import { emit } from "./common.js";

export function schemaCommand(options: { out?: string }): number {
  emit(JSON.stringify(caseJsonSchema(), null, 2), options.out);
  return 0;
}
