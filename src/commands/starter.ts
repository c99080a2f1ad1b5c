// `outfit starter FILE`: writes the starter case (every field explained) for a new pond.
import { existsSync } from "node:fs";
import { printErr, writeFileAtomic } from "../io.js";
import { starterCase } from "./starterCase.js";
import { UsageError } from "./common.js";

export interface StarterCommandOptions {
  units?: string;
  force?: boolean;
}

export function starterCommand(file: string, options: StarterCommandOptions): number {
  const units = (options.units ?? "US").toUpperCase();
  if (units !== "US" && units !== "SI") throw new UsageError("--units", options.units ?? "", '"US" or "SI"');
  if (!file.toLowerCase().endsWith(".json")) throw new UsageError("<file>", file, "a file name ending in .json");
  if (existsSync(file) && !options.force) throw new UsageError("<file>", file, "a file that does not exist yet (or --force to overwrite it)");
  writeFileAtomic(file, JSON.stringify(starterCase(units), null, 2) + "\n");
  printErr(`outfit: wrote ${file} (${units} units); next: outfit route ${file}\n`);
  return 0;
}
