// `npm run bench`: builds with tsc and runs this file. Prints throughput figures and ratios against
// simple baselines measured in the same run; nothing here is a pass/fail test.
import { cpus } from "node:os";
import type { BenchSection } from "./section.js";
import { routingSection } from "./routing.js";
import { searchSection } from "./search.js";
import { speedSection } from "./speed.js";
import { workersSection } from "./workers.js";
import { inputsSection } from "./inputs.js";
import { shardsSection } from "./shards.js";
import { defaultsSection } from "./defaults.js";
import { systemsSection } from "./systems.js";

const sections: BenchSection[] = [routingSection, systemsSection, speedSection, searchSection, workersSection, defaultsSection, shardsSection, inputsSection];

async function main(): Promise<void> {
  const only = process.argv.slice(2);
  process.stdout.write(`outfit bench: node ${process.version}, ${cpus()[0]?.model ?? "unknown CPU"}, ${cpus().length} cores\n`);
  for (const section of sections) {
    if (only.length > 0 && !only.includes(section.name)) continue;
    await section.run();
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`bench failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exitCode = 1;
});
