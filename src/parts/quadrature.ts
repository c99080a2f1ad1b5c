// Gauss-Legendre nodes and weights on [0, 1], computed once by Newton iteration on P_n
// (Abramowitz & Stegun 25.4.29; Numerical Recipes "gauleg").

export interface Rule {
  nodes: Float64Array;
  weights: Float64Array;
}

export function gaussLegendre(n: number): Rule {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let derivative = 0;
    for (let iteration = 0; iteration < 100; iteration++) {
      let p0 = 1;
      let p1 = 0;
      for (let j = 0; j < n; j++) {
        const p2 = p1;
        p1 = p0;
        p0 = ((2 * j + 1) * x * p1 - j * p2) / (j + 1);
      }
      derivative = (n * (x * p0 - p1)) / (x * x - 1);
      const dx = p0 / derivative;
      x -= dx;
      if (Math.abs(dx) < 1e-15) break;
    }
    const w = 2 / ((1 - x * x) * derivative * derivative);
    // Map from [-1, 1] to [0, 1].
    nodes[i] = (1 - x) / 2;
    nodes[n - 1 - i] = (1 + x) / 2;
    weights[i] = w / 2;
    weights[n - 1 - i] = w / 2;
  }
  return { nodes, weights };
}
