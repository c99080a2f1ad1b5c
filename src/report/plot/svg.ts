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

/** A polyline as path data: "M x y L x y ...". */
export function pathData(points: readonly (readonly [number, number])[]): string {
  return points.map(([x, y], i) => `${i === 0 ? "M" : "L"}${coordinate(x)} ${coordinate(y)}`).join(" ");
}

/** A standalone SVG file from inline SVG markup: namespace and XML declaration added. */
export function standaloneSvg(svg: string): string {
  if (!svg.startsWith("<svg ")) throw new Error("standaloneSvg: markup does not start with <svg");
  return `<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" ${svg.slice(5)}\n`;
}
