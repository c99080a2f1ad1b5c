// A case copied to another directory (a candidate's case file, a sized pond's) keeps pointing at the
// files its original named: every relative path in it (the storms' inflow files, the "$schema" an
// editor reads) is made relative to the new directory. Absolute paths and URLs are left as they are.
import { isAbsolute, relative, resolve } from "node:path";

/** Whether a "$schema" value is an address (https:, file: ...) rather than a path. */
const isAddress = (value: string) => /^[a-z][a-z0-9+.-]*:/i.test(value) && !/^[a-z]:[\\/]/i.test(value);

function moved(path: string, fromDir: string, toDir: string): string {
  return relative(resolve(toDir), resolve(fromDir, path)).split("\\").join("/");
}

/** Rewrites, in place, the relative paths of case JSON read from `fromDir` for a copy in `toDir`. */
export function rebaseCase(copy: Record<string, unknown>, fromDir: string, toDir: string): void {
  const schema = copy.$schema;
  if (typeof schema === "string" && schema.length > 0 && !isAbsolute(schema) && !isAddress(schema)) copy.$schema = moved(schema, fromDir, toDir);
  const storms = copy.storms;
  if (!Array.isArray(storms)) return;
  for (const storm of storms as { inflow?: { file?: unknown } }[]) {
    const file = storm?.inflow?.file;
    if (typeof file === "string" && file.length > 0 && !isAbsolute(file)) storm.inflow!.file = moved(file, fromDir, toDir);
  }
}
