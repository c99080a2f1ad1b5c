// Round tick positions: steps of 1, 2 or 5 times a power of ten, about `count` of them over a span.

/**
 * The tick step nearest to span / count, by ratio, among 1, 2 and 5 times a power of ten: the
 * thresholds are the geometric means of neighbouring steps (sqrt 2, sqrt 10, sqrt 50).
 */
export function tickStep(span: number, count: number): number {
  const raw = span / Math.max(1, count);
  const power = Math.pow(10, Math.floor(Math.log10(raw)));
  const scaled = raw / power;
  const mantissa = scaled >= Math.sqrt(50) ? 10 : scaled >= Math.sqrt(10) ? 5 : scaled >= Math.SQRT2 ? 2 : 1;
  return mantissa * power;
}

/** Decimals needed to print multiples of a 1-2-5 step exactly. */
export function stepDecimals(step: number): number {
  return Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
}

export interface Axis {
  domain: [number, number];
  ticks: number[];
  step: number;
}

/**
 * A domain widened outward to whole tick steps, with its ticks. An empty or degenerate interval is
 * widened around its value so that the scale stays defined.
 */
export function niceAxis(min: number, max: number, count = 6): Axis {
  let low = min;
  let high = max;
  if (!(high > low)) {
    const pad = Math.abs(low) > 0 ? Math.abs(low) * 0.1 : 1;
    low -= pad;
    high += pad;
  }
  const step = tickStep(high - low, count);
  // Whole steps around the data; the tolerance keeps a value that is a multiple up to rounding from
  // adding a step, and the checks after rounding keep the domain around the data all the same.
  let start = round(Math.floor(low / step + 1e-9) * step, step);
  let end = round(Math.ceil(high / step - 1e-9) * step, step);
  if (start > low) start = round(start - step, step);
  if (end < high) end = round(end + step, step);
  return { domain: [start, end], ticks: tickValues(start, end, step), step };
}

/** Ticks at whole multiples of a step within [min, max]. */
export function tickValues(min: number, max: number, step: number): number[] {
  const first = Math.ceil(min / step - 1e-9);
  const last = Math.floor(max / step + 1e-9);
  const ticks: number[] = [];
  for (let k = first; k <= last; k++) ticks.push(round(k * step, step));
  return ticks;
}

/** A tick value printed with the decimals its step needs and thousands separated. */
export function tickLabel(value: number, step: number): string {
  const digits = stepDecimals(step);
  return value.toLocaleString("en-US", { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

function round(value: number, step: number): number {
  const digits = stepDecimals(step);
  const rounded = Number(value.toFixed(Math.min(digits + 2, 15)));
  return rounded === 0 ? 0 : rounded;
}
