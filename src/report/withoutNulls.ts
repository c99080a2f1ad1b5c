// JSON without nulls: keys whose value is null are left out (at any depth), so that an output that
// has no value for a field omits it instead of printing null where a reader expects a number.
export function withoutNulls<T>(value: T): T {
  if (Array.isArray(value)) return value.map(withoutNulls) as T;
  if (value && typeof value === "object" && !ArrayBuffer.isView(value)) {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) if (v !== null) out[k] = withoutNulls(v);
    return out as T;
  }
  return value;
}
