// How deep a parsed JSON value is nested, without recursion (a file nested thousands of levels deep
// must give a user error, not exhaust the stack in the checks that walk it).

/** The case format's deepest arrays (a pre-development hydrograph's points, a bypass's) are this many levels down. */
export const FORMAT_DEPTH = 8;

/** The deepest nesting a case file may have: deeper than any case needs. */
export const MAX_CASE_DEPTH = 32;

export interface Nesting {
  /** Levels of arrays and objects (a bare number or string: 0). */
  depth: number;
  /** When the value is nested more than `limit` levels: the JSON path of the first array or object more than `FORMAT_DEPTH` levels down (where the file leaves the case format); else null. */
  beyond: string | null;
}

function isContainer(v: unknown): v is object {
  return v !== null && typeof v === "object";
}

/** Measures the nesting of a JSON value level by level; past `limit`, says where it left the case format's depth. */
export function nesting(value: unknown, limit: number): Nesting {
  let depth = 0;
  let deeper: string | null = null;
  let level: { value: object; path: string }[] = isContainer(value) ? [{ value, path: "" }] : [];
  while (level.length > 0) {
    depth++;
    if (depth > FORMAT_DEPTH && deeper === null) deeper = level[0].path;
    // Paths are only built down to that level (beyond it one path is enough).
    const named = depth <= FORMAT_DEPTH;
    const next: { value: object; path: string }[] = [];
    for (const { value: v, path } of level) {
      if (Array.isArray(v)) {
        v.forEach((item, i) => {
          if (isContainer(item)) next.push({ value: item, path: named ? `${path}[${i}]` : path });
        });
      } else {
        for (const [k, item] of Object.entries(v)) if (isContainer(item)) next.push({ value: item, path: named ? (path ? `${path}.${k}` : k) : path });
      }
    }
    level = next;
  }
  return { depth, beyond: depth > limit ? deeper : null };
}
