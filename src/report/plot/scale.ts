// A linear scale: maps a data interval (domain) onto a drawing interval (range) and back.

export interface LinearScale {
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
  (value: number): number;
  invert(position: number): number;
}

export function linearScale(domain: readonly [number, number], range: readonly [number, number]): LinearScale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const span = d1 - d0;
  if (!(span > 0) || !Number.isFinite(span)) throw new Error(`linearScale: domain [${d0}, ${d1}] must be finite and increasing`);
  const factor = (r1 - r0) / span;
  const scale = ((value: number) => r0 + (value - d0) * factor) as LinearScale;
  return Object.assign(scale, {
    domain: [d0, d1] as const,
    range: [r0, r1] as const,
    invert: (position: number) => d0 + (position - r0) / factor,
  });
}
