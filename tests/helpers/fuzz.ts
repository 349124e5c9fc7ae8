/**
 * Invalid request bodies for the bad-input tests, and a "changed nothing" check on the whole database.
 *
 * Bodies are derived from a valid sample body of the route and the route's zod schema: every node of the
 * sample is replaced by values of the wrong type, out of range, NaN-like strings, strings over the field's
 * maximum, huge arrays and nested garbage, or removed; fast-check adds random JSON values at random nodes and
 * picks (with a seed per route, so a run can be repeated) which of them are sent. The schema is the oracle:
 * only a body the schema refuses is kept, and the field paths the schema names are what the route must
 * answer with.
 */
import fc from "fast-check";
import { createHash } from "node:crypto";
import type { ZodType } from "zod";
import { zodFields } from "../../server/middleware/error-handler";
import { testSequelize } from "./db";

export type Path = Array<string | number>;

export interface InvalidBody {
  /** What was done, e.g. `planes.0.pitch ← "NaN"` (for failure messages). */
  label: string;
  /** The node that was changed ([] for the whole body). */
  path: Path;
  body: unknown;
  /** `{ path: message }` as the schema reports it (what the route must answer). */
  expected: Record<string, string>;
}

export const pathKey = (p: Path) => p.map(String).join(".");

const clone = <T>(v: T): T => (v === undefined ? v : (JSON.parse(JSON.stringify(v)) as T));

/** Every node of a JSON value, parents before children (the root is []). */
export function nodes(value: unknown, path: Path = []): Array<{ path: Path; value: unknown }> {
  const out: Array<{ path: Path; value: unknown }> = [{ path, value }];
  if (Array.isArray(value)) value.forEach((v, i) => out.push(...nodes(v, [...path, i])));
  else if (value && typeof value === "object") for (const [k, v] of Object.entries(value)) out.push(...nodes(v, [...path, k]));
  return out;
}

export function setAt(body: unknown, path: Path, value: unknown): unknown {
  if (path.length === 0) return clone(value);
  const copy = clone(body) as Record<string | number, unknown>;
  let cur = copy;
  for (const k of path.slice(0, -1)) cur = cur[k] as Record<string | number, unknown>;
  cur[path[path.length - 1]!] = clone(value);
  return copy;
}

export function removeAt(body: unknown, path: Path): unknown {
  const copy = clone(body) as Record<string | number, unknown>;
  let cur: unknown = copy;
  for (const k of path.slice(0, -1)) cur = (cur as Record<string | number, unknown>)[k];
  const last = path[path.length - 1]!;
  if (Array.isArray(cur)) cur.splice(Number(last), 1);
  else delete (cur as Record<string | number, unknown>)[last];
  return copy;
}

// ---------------------------------------------------------------------------------------------------
// The schema: the longest string a node may hold (zod 4 keeps `.max()` as a max_length check).

interface ZodInternals {
  _zod: { def: { type: string; checks?: Array<{ _zod: { def: { check: string; maximum?: number } } }>; [k: string]: unknown } };
}

const defOf = (s: unknown) => (s as ZodInternals)._zod.def;

/** The schemas a value at this level may be checked by (wrappers, pipes and unions unwrapped). */
function unwrap(schema: unknown): unknown[] {
  const def = defOf(schema);
  switch (def.type) {
    case "optional":
    case "nullable":
    case "default":
    case "prefault":
    case "catch":
    case "readonly":
    case "nonoptional":
      return unwrap(def.innerType);
    case "pipe":
      return [...unwrap(def.in), ...unwrap(def.out)];
    case "union":
      return (def.options as unknown[]).flatMap(unwrap);
    case "lazy":
      return unwrap((def.getter as () => unknown)());
    default:
      return [schema];
  }
}

/** The schemas that check the value at `path` of a body (empty when the schema does not know the path). */
export function schemasAt(schema: ZodType, path: Path): unknown[] {
  let level = unwrap(schema);
  for (const key of path) {
    const next: unknown[] = [];
    for (const s of level) {
      const def = defOf(s);
      if (def.type === "object" && typeof key === "string" && (def.shape as Record<string, unknown>)[key]) next.push(...unwrap((def.shape as Record<string, unknown>)[key]));
      else if (def.type === "array" && typeof key === "number") next.push(...unwrap(def.element));
      else if (def.type === "tuple" && typeof key === "number") {
        const items = def.items as unknown[];
        if (items[key]) next.push(...unwrap(items[key]));
      } else if (def.type === "record") next.push(...unwrap(def.valueType));
    }
    level = next;
  }
  return level;
}

const maxLengthOf = (s: unknown): number | undefined =>
  defOf(s).checks?.map((c) => c._zod.def).find((d) => d.check === "max_length")?.maximum;

/** The `.max()` of the string or array at `path`, if any. */
export function maxLengthAt(schema: ZodType, path: Path): number | undefined {
  const found = schemasAt(schema, path).map(maxLengthOf).filter((n): n is number => n !== undefined);
  return found.length ? Math.min(...found) : undefined;
}

/**
 * Every string, array and record in the schema without an upper bound, as `path (type)`, with `*` for an
 * array element or record value. The body limit caps a request, but a field's own limit is what keeps an
 * oversized value out of the database and the PDFs.
 */
export function unboundedNodes(schema: unknown, path = "", seen = new Set<unknown>()): string[] {
  if (seen.has(schema)) return [];
  seen.add(schema);
  const out: string[] = [];
  for (const s of unwrap(schema)) {
    const def = defOf(s);
    const here = path || "(body)";
    if (def.type === "string" && maxLengthOf(s) === undefined) {
      // An enum-like string (a regex that allows no repetition) is bounded by its pattern; all others need a max.
      const formats = ["email", "url", "uuid", "cuid", "datetime"];
      const fmt = (def as { format?: string }).format;
      if (!fmt || !formats.includes(fmt)) out.push(`${here} (string)`);
    }
    if (def.type === "array" && maxLengthOf(s) === undefined) out.push(`${here} (array)`);
    if (def.type === "record" && !def.checks?.length) out.push(`${here} (record)`); // a refine may bound its size
    if (def.type === "object") for (const [k, v] of Object.entries(def.shape as Record<string, unknown>)) out.push(...unboundedNodes(v, path ? `${path}.${k}` : k, seen));
    if (def.type === "array") out.push(...unboundedNodes(def.element, `${path}.*`, seen));
    if (def.type === "tuple") (def.items as unknown[]).forEach((it, i) => out.push(...unboundedNodes(it, `${path}.${i}`, seen)));
    if (def.type === "record") out.push(...unboundedNodes(def.valueType, `${path}.*`, seen));
  }
  return [...new Set(out)];
}

// ---------------------------------------------------------------------------------------------------
// Candidate mutations

/** Nested garbage: objects in arrays in objects, 40 levels deep. */
export function deepGarbage(depth = 40): unknown {
  let v: unknown = { x: "\u0000", y: [null, -0, 1e308] };
  for (let i = 0; i < depth; i++) v = i % 2 ? { nested: v, n: i } : [v, "garbage", i];
  return v;
}

const NAN_LIKE = ["NaN", "Infinity", "-Infinity", "1e999", "0x1F", "12abc", "", " ", "1,5", "∞"];

function wrongValuesFor(value: unknown, max: number | undefined): Array<{ label: string; value: unknown }> {
  const common = [
    { label: "null", value: null },
    { label: "{} (object)", value: {} },
    { label: "nested garbage", value: deepGarbage(8) },
  ];
  if (typeof value === "string") {
    return [
      ...common,
      { label: "42 (number)", value: 42 },
      { label: "true (boolean)", value: true },
      { label: '["x"] (array)', value: [value] },
      { label: "unknown option", value: "not-an-option-\u2603" },
      ...(max !== undefined ? [{ label: `${max + 1} characters (max ${max})`, value: "é".repeat(max + 1) }] : []),
    ];
  }
  if (typeof value === "number") {
    return [
      ...common,
      ...NAN_LIKE.map((s) => ({ label: JSON.stringify(s), value: s })),
      { label: "true (boolean)", value: true },
      { label: "[1] (array)", value: [value] },
      { label: "1e21", value: 1e21 },
      { label: "-1e21", value: -1e21 },
      { label: "-1", value: -1 },
      { label: "0.5", value: 0.5 },
      { label: "4294967296", value: 4294967296 },
    ];
  }
  if (typeof value === "boolean") {
    return [...common, { label: '"yes"', value: "yes" }, { label: '"true"', value: "true" }, { label: "1", value: 1 }, { label: "[]", value: [] }];
  }
  if (Array.isArray(value)) {
    // Just over the field's max (or 5001 when it has none): still under the body limit, so the field answers.
    const huge = Array.from({ length: (max ?? 5_000) + 1 }, () => clone(value[0] ?? "x"));
    return [
      ...common.filter((c) => c.label !== "{} (object)"),
      { label: '"not a list"', value: "not a list" },
      { label: "{} (object)", value: {} },
      { label: `${huge.length} elements`, value: huge },
      { label: "[null]", value: [null] },
      { label: "[nested garbage]", value: [deepGarbage(6)] },
      { label: "[42, true]", value: [42, true] },
    ];
  }
  if (value && typeof value === "object") {
    return [
      { label: "null", value: null },
      { label: "[] (array)", value: [] },
      { label: '"text"', value: "text" },
      { label: "42", value: 42 },
      { label: "nested garbage", value: deepGarbage(8) },
    ];
  }
  return common;
}

/** Bodies no JSON route should accept as a whole. */
const ROOT_GARBAGE: Array<{ label: string; value: unknown }> = [
  { label: "[] (array body)", value: [] },
  { label: "[{}] (array body)", value: [{}] },
  { label: "nested garbage body", value: deepGarbage() },
];

const seedOf = (s: string) => createHash("sha256").update(s).digest().readUInt32BE(0);

/**
 * About `count` invalid bodies for a route: the schema refuses each one. Whole-body garbage and the
 * removal of each required field come first, then fast-check picks among the per-field mutations and random
 * JSON values at random nodes (seeded by `name`, so the same bodies come out on every run).
 */
export function invalidBodies(name: string, schema: ZodType, sample: unknown, count = 25): InvalidBody[] {
  const seed = seedOf(name);
  const candidates: Array<{ label: string; path: Path; body: unknown }> = [];
  for (const g of ROOT_GARBAGE) candidates.push({ label: g.label, path: [], body: g.value });
  const all = nodes(sample).filter((n) => n.path.length > 0);
  const removals: typeof candidates = [];
  for (const n of all) removals.push({ label: `${pathKey(n.path)} removed`, path: n.path, body: removeAt(sample, n.path) });
  const changes: typeof candidates = [];
  for (const n of all) {
    for (const w of wrongValuesFor(n.value, maxLengthAt(schema, n.path))) {
      changes.push({ label: `${pathKey(n.path)} ← ${w.label}`, path: n.path, body: setAt(sample, n.path, w.value) });
    }
  }
  // fast-check: random JSON values at random nodes of the sample.
  if (all.length) {
    const randomAtNode = fc.tuple(fc.constantFrom(...all), fc.jsonValue({ maxDepth: 3 }));
    for (const [n, v] of fc.sample(randomAtNode, { seed, numRuns: 60 })) {
      changes.push({ label: `${pathKey(n.path)} ← random ${JSON.stringify(v).slice(0, 40)}`, path: n.path, body: setAt(sample, n.path, v) });
    }
  }

  const refused = (c: { label: string; path: Path; body: unknown }): InvalidBody | null => {
    const r = schema.safeParse(c.body);
    return r.success ? null : { ...c, expected: zodFields(r.error) };
  };
  const out: InvalidBody[] = [];
  const take = (list: typeof candidates, max: number) => {
    for (const c of list) {
      if (out.length >= count || max <= 0) return;
      const b = refused(c);
      if (b && !out.some((o) => o.label === b.label)) {
        out.push(b);
        max--;
      }
    }
  };
  take(candidates, ROOT_GARBAGE.length);
  const [shuffledRemovals] = fc.sample(fc.shuffledSubarray(removals, { minLength: removals.length, maxLength: removals.length }), { seed, numRuns: 1 });
  take(shuffledRemovals ?? [], 6);
  const [shuffledChanges] = fc.sample(fc.shuffledSubarray(changes, { minLength: changes.length, maxLength: changes.length }), { seed: seed + 1, numRuns: 1 });
  take(shuffledChanges ?? [], count);
  return out;
}

/** Whether a reported field key names the changed node, one of its children or one of its parents. */
export function relatedKey(key: string, path: Path): boolean {
  const p = pathKey(path);
  if (!p) return true;
  return key === p || key.startsWith(`${p}.`) || p.startsWith(`${key}.`);
}

// ---------------------------------------------------------------------------------------------------
// The database, before and after

/** Tables whose rows change on any request: the session store's expiry touch and rate-limit counters. */
const VOLATILE = /^(sessions|rate_limit)/;

/** `CHECKSUM TABLE` of every table (but the volatile ones): equal before and after means nothing changed. */
export async function databaseChecksums(): Promise<Record<string, string>> {
  const db = testSequelize();
  const [tables] = await db.query(
    "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' ORDER BY table_name",
  );
  const names = (tables as Array<{ name: string }>).map((t) => t.name).filter((n) => !VOLATILE.test(n));
  const [rows] = await db.query(`CHECKSUM TABLE ${names.map((n) => `\`${n}\``).join(", ")}`);
  const out: Record<string, string> = {};
  for (const r of rows as Array<{ Table: string; Checksum: number | bigint | string | null }>) {
    out[r.Table.split(".").pop()!] = String(r.Checksum);
  }
  return out;
}

/** The tables whose checksum differs. */
export function changedTables(before: Record<string, string>, after: Record<string, string>): string[] {
  const keys = new Set([...Object.keys(before), ...Object.keys(after)]);
  return [...keys].filter((k) => before[k] !== after[k]).sort();
}

/** Rows of any text column, in any table, holding `marker`: as `table.column` with the count. */
export async function findText(marker: string): Promise<string[]> {
  const db = testSequelize();
  const [cols] = await db.query(
    `SELECT table_name AS t, column_name AS c FROM information_schema.columns
     WHERE table_schema = DATABASE() AND data_type IN ('char','varchar','text','mediumtext','longtext','tinytext','json','longblob','blob','mediumblob')`,
  );
  const hits: string[] = [];
  for (const { t, c } of cols as Array<{ t: string; c: string }>) {
    if (VOLATILE.test(t)) continue;
    const [rows] = await db.query(`SELECT COUNT(*) AS n FROM \`${t}\` WHERE \`${c}\` LIKE ?`, { replacements: [`%${marker}%`] });
    const n = Number((rows as Array<{ n: number | bigint }>)[0]!.n);
    if (n > 0) hits.push(`${t}.${c}: ${n}`);
  }
  return hits;
}

// ---------------------------------------------------------------------------------------------------
// Hostile text

/** Text a field must store and give back exactly: accents, CJK, emoji, RTL, combining marks, SQL, HTML. */
export const HOSTILE_TEXTS = {
  accents: "Łódź crème brûlée, Ærøskøbing, São Tomé",
  cjk: "屋根の見積もり 금속 지붕",
  emoji: "Roof 🏠🔨 done 👍🏽",
  rtl: "גג מתכת سقف معدني",
  combining: "Cafe\u0301 n\u0303 Z\u0307",
  sql: "'; DROP TABLE jobs; -- \" OR 1=1",
  html: '<script>alert(1)</script><img src=x onerror="alert(2)">',
} as const;

/** The parts the proposal's font (Inter: Latin, Cyrillic, Greek, Vietnamese) draws as text. */
export const PDF_DRAWN_TEXTS = [HOSTILE_TEXTS.accents, HOSTILE_TEXTS.sql, HOSTILE_TEXTS.html] as const;
