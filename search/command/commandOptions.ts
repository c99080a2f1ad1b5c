// The options of `outfit design` (and `outfit gather`) as commander hands them over: shared by the
// outlet search's command and the pond loop's, so neither imports the other.
export interface DesignCommandOptions {
  seed?: string;
  budget?: string;
  time?: string;
  top?: string;
  margin?: string;
  starts?: string;
  beam?: string;
  workers?: string;
  shard?: string;
  json?: boolean;
  out?: string;
  resume?: boolean;
  progress?: boolean;
  quiet?: boolean;
  check?: boolean;
  /** `outfit gather`: output directories of shards whose journals are replayed. */
  gather?: string[];
  wide?: boolean;
  sizePond?: boolean;
  vary?: string;
  keepRiser?: boolean;
  keepBarrel?: boolean;
  rank?: string;
}
