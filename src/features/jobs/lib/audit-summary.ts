import type { AuditEventDto } from "@shared/schemas/audit";
import { formatMoney, formatSquares } from "@/lib/format";
import { STATUS_LABELS, isJobStatus } from "@/features/jobs/lib/status";

/** A log entry in words: one headline and, when there is more to say, detail lines. */
export type AuditSummary = { title: string; details: string[] };

/** Names for user ids the log mentions (estimator, crew); unknown ids are shown as "user #id". */
export type NameLookup = (id: number) => string | undefined;

type FromTo = { from: unknown; to: unknown };
const isFromTo = (v: unknown): v is FromTo => typeof v === "object" && v !== null && "from" in v && "to" in v;
const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

const statusName = (s: unknown) => (typeof s === "string" && isJobStatus(s) ? STATUS_LABELS[s] : humanize(String(s)));
const quoteStatus = (s: unknown) => humanize(String(s ?? ""));

/** "status_changed" → "status changed"; "in_review" → "in review". */
export function humanize(s: string): string {
  return s.replace(/[_-]+/g, " ").trim();
}

const capital = (s: string) => (s ? s[0]!.toUpperCase() + s.slice(1) : s);

/** A value in a "from → to" line. */
function show(v: unknown): string {
  if (v === null || v === undefined || v === "") return "none";
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (Array.isArray(v)) return v.length ? v.map(show).join(", ") : "none";
  if (isRecord(v)) return "…";
  const s = String(v);
  return s.length > 60 ? `“${s.slice(0, 57)}…”` : typeof v === "string" ? `“${s}”` : s;
}

const SITE_LABELS: Record<string, string> = {
  atticType: "Attic",
  atticFloorAreaSqFt: "Attic floor area (sq ft)",
  climateZone: "Climate zone",
  iceDamRisk: "Ice-dam risk",
  ventException: "1/300 ventilation exception",
  codeEdition: "Code edition",
  coolRoofRequired: "Cool roof required",
  vaporRetarder: "Vapour retarder",
  existingLayers: "Existing layers",
  tearOff: "Tear-off",
  "wind.ratedAssemblyRequired": "Rated assembly required",
  "wind.basicWindSpeedMph": "Basic wind speed (mph)",
  "wind.exposure": "Exposure",
  "wind.leastHorizontalDimensionFt": "Least horizontal dimension (ft)",
  "wind.meanRoofHeightFt": "Mean roof height (ft)",
};

const ADDRESS_LABELS: Record<string, string> = {
  siteAddressLine1: "Street",
  siteAddressLine2: "Apt, unit",
  siteCity: "City",
  siteRegion: "State",
  sitePostalCode: "ZIP",
};

/** The leaves of a site object as "a.b" paths. */
function flatten(v: unknown, prefix = ""): Record<string, unknown> {
  if (!isRecord(v)) return {};
  const out: Record<string, unknown> = {};
  for (const [k, x] of Object.entries(v)) {
    const key = prefix ? `${prefix}.${k}` : k;
    if (isRecord(x)) Object.assign(out, flatten(x, key));
    else out[key] = x;
  }
  return out;
}

/** "Climate zone: “4A” → “5A”" for each site value that changed. */
export function siteDiff(from: unknown, to: unknown): string[] {
  const a = flatten(from);
  const b = flatten(to);
  const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])];
  const lines: string[] = [];
  for (const k of keys) {
    if (JSON.stringify(a[k]) === JSON.stringify(b[k])) continue;
    lines.push(`${SITE_LABELS[k] ?? humanize(k)}: ${show(a[k])} → ${show(b[k])}`);
  }
  return lines;
}

const person = (id: unknown, names: NameLookup) =>
  id === null || id === undefined ? "nobody" : (names(Number(id)) ?? `user #${String(id)}`);

function jobUpdated(changes: Record<string, unknown>, names: NameLookup): AuditSummary {
  const details: string[] = [];
  let title = "Job updated";
  const keys = Object.keys(changes);
  for (const [k, v] of Object.entries(changes)) {
    if (!isFromTo(v)) continue;
    if (k === "status") {
      const line = `Status: ${statusName(v.from)} → ${statusName(v.to)}`;
      if (keys.length === 1) title = line;
      else details.push(line);
    } else if (k === "site") {
      const lines = siteDiff(v.from, v.to);
      if (keys.length === 1) title = "Site data changed";
      details.push(...(lines.length ? lines : ["Site data changed"]));
    } else if (k in ADDRESS_LABELS) {
      details.push(`${ADDRESS_LABELS[k]}: ${show(v.from)} → ${show(v.to)}`);
    } else if (k === "notes") {
      details.push(v.to ? "Notes edited" : "Notes cleared");
    } else if (k === "customerId") {
      details.push("Customer changed");
    } else if (k === "estimatorId") {
      details.push(`Estimator: ${person(v.from, names)} → ${person(v.to, names)}`);
    } else {
      details.push(`${capital(humanize(k))}: ${show(v.from)} → ${show(v.to)}`);
    }
  }
  if (keys.length > 0 && keys.every((k) => k in ADDRESS_LABELS)) title = "Site address changed";
  return { title, details };
}

function roofSaved(action: string, c: Record<string, unknown>): AuditSummary {
  const parts: string[] = [];
  const v = c.version;
  if (isFromTo(v)) parts.push(`version ${String(v.from)} → ${String(v.to)}`);
  if (typeof c.planes === "number") parts.push(`${c.planes} ${c.planes === 1 ? "plane" : "planes"}`);
  if (typeof c.squares === "number") parts.push(`${formatSquares(c.squares)} squares`);
  const details: string[] = [];
  if (c.underlay === "set") details.push("Tracing underlay set");
  if (c.underlay === "removed") details.push("Tracing underlay removed");
  if (typeof c.stacks === "number") details.push(`${c.stacks} roof ${c.stacks === 1 ? "assembly" : "assemblies"}`);
  const head = action === "created" ? "Roof first saved" : "Roof saved";
  return { title: parts.length ? `${head}: ${parts.join(", ")}` : head, details };
}

function quoteEvent(action: string, c: Record<string, unknown>): AuditSummary {
  const name = typeof c.number === "string" ? `Quote ${c.number}` : "Quote";
  const rev = typeof c.revisionNo === "number" ? `revision ${c.revisionNo}` : "";
  const total = (t: unknown) => (typeof t === "number" ? formatMoney(t) : isFromTo(t) ? `${formatMoney(t.from as number)} → ${formatMoney(t.to as number)}` : "");
  const details: string[] = [];
  const withBits = (...bits: string[]) => bits.filter(Boolean).join(", ");
  switch (action) {
    case "created":
      return { title: `${name} created`, details: [withBits(rev, total(c.totalCents) && `total ${total(c.totalCents)}`)].filter(Boolean) };
    case "submitted":
      return { title: `${name} submitted for approval`, details: [rev].filter(Boolean) };
    case "approved":
      if (typeof c.reason === "string" && c.reason) details.push(`Reason: ${c.reason}`);
      if (c.belowMinMargin) details.push("Below the minimum margin");
      return { title: `${name} approved`, details: [rev, ...details].filter(Boolean) };
    case "returned":
      if (typeof c.comment === "string" && c.comment) details.push(`Comment: ${c.comment}`);
      return { title: `${name} returned to the estimator`, details: [rev, ...details].filter(Boolean) };
    case "revised":
      return { title: `${name}: new revision ${String(c.revisionNo ?? "")}`.trim(), details: c.fromStatus ? [`From revision ${String(c.fromRevisionNo)} (${quoteStatus(c.fromStatus)})`] : [] };
    case "recalculated":
    case "updated": {
      const t = total(c.totalCents);
      return { title: `${name} ${action === "updated" ? "edited" : "recalculated"}`, details: [withBits(rev, t && `total ${t}`)].filter(Boolean) };
    }
    default: {
      const st = c.status;
      if (isFromTo(st)) details.push(`Status: ${quoteStatus(st.from)} → ${quoteStatus(st.to)}`);
      return { title: `${name} ${humanize(action)}`, details };
    }
  }
}

/** One audit event in words. */
export function summarizeAudit(e: AuditEventDto, names: NameLookup = () => undefined): AuditSummary {
  const c = e.changes ?? {};
  if (e.entityType === "job") {
    switch (e.action) {
      case "created": {
        const who = typeof c.customerName === "string" ? ` for ${c.customerName}` : "";
        const details = [`Status: ${statusName(c.status ?? "lead")}`];
        if (c.estimatorId) details.push(`Estimator: ${person(c.estimatorId, names)}`);
        return { title: `Job created${who}`, details };
      }
      case "updated":
        return jobUpdated(c, names);
      case "status_changed": {
        const st = c.status;
        const title = isFromTo(st) ? `Status: ${statusName(st.from)} → ${statusName(st.to)}` : "Status changed";
        return { title, details: typeof c.reason === "string" && c.reason ? [capital(c.reason)] : [] };
      }
      case "assigned": {
        const details: string[] = [];
        if (isFromTo(c.estimatorId)) details.push(`Estimator: ${person(c.estimatorId.from, names)} → ${person(c.estimatorId.to, names)}`);
        if (isFromTo(c.crewIds)) {
          const list = (v: unknown) => (Array.isArray(v) && v.length ? v.map((id) => person(id, names)).join(", ") : "none");
          details.push(`Crew: ${list(c.crewIds.from)} → ${list(c.crewIds.to)}`);
        }
        return { title: "Assignment changed", details };
      }
      case "archived":
        return { title: "Job archived", details: [] };
      case "restored":
        return { title: "Job restored", details: [] };
    }
  }
  if (e.entityType === "roof") return roofSaved(e.action, c);
  if (e.entityType === "quote") return quoteEvent(e.action, c);
  if (e.entityType === "attachment") {
    const name = typeof c.name === "string" ? `: ${c.name}` : "";
    const verb = { uploaded: "File uploaded", updated: "File details changed", deleted: "File deleted" }[e.action] ?? `File ${humanize(e.action)}`;
    return { title: `${verb}${name}`, details: [] };
  }
  // anything newer than this screen: still readable
  const details = Object.entries(c)
    .filter(([, v]) => isFromTo(v))
    .map(([k, v]) => `${capital(humanize(k))}: ${show((v as FromTo).from)} → ${show((v as FromTo).to)}`);
  return { title: capital(`${humanize(e.entityType)} ${humanize(e.action)}`), details };
}
