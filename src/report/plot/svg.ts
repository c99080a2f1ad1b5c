// Building blocks of SVG (and HTML) text: escaping, attributes, elements and coordinates.

const ENTITIES: Readonly<Record<string, string>> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" };

/** Escapes text for element content and quoted attribute values of HTML and SVG. */
export function escapeMarkup(text: string): string {
  return text.replace(/[&<>"']/g, (ch) => ENTITIES[ch]);
}

export type AttributeValue = string | number | undefined | null | false;

/** ` name="value"` pairs; undefined, null and false are left out, values escaped. */
export function attributes(attrs: Readonly<Record<string, AttributeValue>>): string {
  let out = "";
  for (const [name, value] of Object.entries(attrs)) {
    if (value === undefined || value === null || value === false) continue;
    out += ` ${name}="${escapeMarkup(typeof value === "number" ? coordinate(value) : value)}"`;
  }
  return out;
}

/** An element with escaped attributes; `children` is markup (already escaped), none makes it empty. */
export function element(name: string, attrs: Readonly<Record<string, AttributeValue>>, children?: string): string {
  return children === undefined ? `<${name}${attributes(attrs)}/>` : `<${name}${attributes(attrs)}>${children}</${name}>`;
}

/** A drawing coordinate with two decimals (1/100 of a unit) and no trailing zeros. */
export function coordinate(value: number): string {
  const text = String(Math.round(value * 100) / 100);
  return text === "-0" ? "0" : text;
}

/**
 * The vertices of a polyline needed to draw it within `tolerance` (drawing units) of every vertex
 * left out: Douglas-Peucker (Douglas & Peucker 1973, Cartographica 10(2)), with an explicit stack.
 * The distance is measured across the line's independent variable: vertically for a line whose x
 * never falls (a hydrograph: the value at each time stays within the tolerance), horizontally for one
 * whose y never falls in drawing order (a rating: the flow at each stage), else perpendicular. A
 * routed series of thousands of steps draws in a few hundred vertices at a tenth of a pixel.
 */
export function simplify(points: readonly (readonly [number, number])[], tolerance: number): (readonly [number, number])[] {
  const n = points.length;
  if (n <= 2) return [...points];
  let xRises = true;
  let yMonotone = true;
  for (let i = 1; i < n; i++) {
    if (points[i][0] < points[i - 1][0]) xRises = false;
    if ((points[i][1] - points[i - 1][1]) * (points[n - 1][1] - points[0][1]) < 0) yMonotone = false;
  }
  const mode = xRises ? "vertical" : yMonotone ? "horizontal" : "perpendicular";
  const keep = new Uint8Array(n);
  keep[0] = 1;
  keep[n - 1] = 1;
  const stack: [number, number][] = [[0, n - 1]];
  while (stack.length > 0) {
    const [a, b] = stack.pop()!;
    const [ax, ay] = points[a];
    const [bx, by] = points[b];
    const dx = bx - ax;
    const dy = by - ay;
    const length = Math.hypot(dx, dy);
    let worst = -1;
    let at = -1;
    for (let i = a + 1; i < b; i++) {
      const [px, py] = points[i];
      let d: number;
      if (mode === "vertical") d = dx > 0 ? Math.abs(py - (ay + (dy * (px - ax)) / dx)) : Math.max(Math.abs(py - ay), Math.abs(py - by));
      else if (mode === "horizontal") d = dy !== 0 ? Math.abs(px - (ax + (dx * (py - ay)) / dy)) : Math.max(Math.abs(px - ax), Math.abs(px - bx));
      else {
        // Distance to the segment (to its nearer end beyond it).
        const t = length > 0 ? ((px - ax) * dx + (py - ay) * dy) / (length * length) : 0;
        if (t <= 0) d = Math.hypot(px - ax, py - ay);
        else if (t >= 1) d = Math.hypot(px - bx, py - by);
        else d = Math.abs((px - ax) * dy - (py - ay) * dx) / length;
      }
      if (d > worst) {
        worst = d;
        at = i;
      }
    }
    if (worst > tolerance) {
      keep[at] = 1;
      stack.push([a, at], [at, b]);
    }
  }
  return points.filter((_, i) => keep[i] === 1);
}

/** A polyline as path data: "M x y L x y ...". */
export function pathData(points: readonly (readonly [number, number])[]): string {
  return points.map(([x, y], i) => `${i === 0 ? "M" : "L"}${coordinate(x)} ${coordinate(y)}`).join(" ");
}

/** A standalone SVG file from inline SVG markup: namespace and XML declaration added. */
export function standaloneSvg(svg: string): string {
  if (!svg.startsWith("<svg ")) throw new Error("standaloneSvg: markup does not start with <svg");
  return `<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" ${svg.slice(5)}\n`;
}
