type ClassValue = string | number | null | undefined | false | ClassValue[] | Record<string, boolean | null | undefined>;

/** Joins class names, skipping falsy ones; objects add their keys whose value is truthy. */
export function cn(...values: ClassValue[]): string {
  const out: string[] = [];
  const add = (v: ClassValue) => {
    if (!v && v !== 0) return;
    if (Array.isArray(v)) v.forEach(add);
    else if (typeof v === "object") {
      for (const [k, on] of Object.entries(v)) if (on) out.push(k);
    } else out.push(String(v));
  };
  values.forEach(add);
  return out.join(" ");
}
