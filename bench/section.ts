// A bench section: one module per subject (routing here; an optimiser section can be added beside
// it), each printing its own figures. `run.ts` calls them in order.
export interface BenchSection {
  name: string;
  run(): void | Promise<void>;
}
