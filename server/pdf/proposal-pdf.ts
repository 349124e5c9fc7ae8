/**
 * The proposal PDF (pdfkit, Inter). Layout, all measured before drawing: company header, homeowner and
 * site, scope of work per area, the roof plan (vector), options and prices, deposit and payment terms,
 * exclusions, warranty, the safety and code box, the acceptance block; "Page N of M" on every page.
 */
import {
  formatDate,
  formatDateTimeUtc,
  formatMoney,
  formatPercent,
  formatPitch,
  formatSquares,
  type PlanPlane,
  type ProposalDocDto,
} from "../../shared/schemas/proposal";
import { loadInterFonts, type FontFamily } from "./fonts";
import { COLORS, Flow, Typesetter, drawCompanyMark, drawPageFooters, newDocument, polygonPath, type TextStyle } from "./typeset";

export const PROPOSAL_MARGINS = { top: 50, bottom: 58, left: 50, right: 50 };

const BODY: TextStyle = { size: 9.5, color: COLORS.ink, leading: 1.42 };
const SMALL: TextStyle = { size: 8.5, color: COLORS.muted, leading: 1.38 };
const LABEL: TextStyle = { size: 7.5, weight: "semibold", color: COLORS.faint, leading: 1.3 };

export interface RenderOptions {
  /** Font family (default Inter; the benchmark passes Helvetica). */
  fonts?: FontFamily;
}

export async function renderProposalPdf(doc: ProposalDocDto, opts: RenderOptions = {}): Promise<Buffer> {
  const family = opts.fonts ?? loadInterFonts();
  const { doc: pdf, finish } = newDocument({
    title: `Proposal ${doc.proposalNumber}`,
    author: doc.company.name,
    subject: `Roofing proposal for ${doc.homeowner.name}`,
    created: new Date(`${doc.date}T12:00:00Z`),
  });
  const ts = new Typesetter(pdf, family);
  const flow = new Flow(ts, { margins: PROPOSAL_MARGINS, onNewPage: (f) => runningHeader(f, doc) });

  header(flow, doc);
  parties(flow, doc);
  flow.gap(10);
  flow.text(doc.introduction, BODY);

  scope(flow, doc);
  plan(flow, doc.plan.planes);
  optionsTable(flow, doc);
  terms(flow, doc);
  cautions(flow, doc.cautions);
  acceptance(flow, doc);

  drawPageFooters(ts, PROPOSAL_MARGINS, `${doc.company.name} · Proposal ${doc.proposalNumber}${doc.revisionNo > 1 ? ` (revision ${doc.revisionNo})` : ""}`);
  return finish();
}

// ---------------------------------------------------------------------------------------------------

function runningHeader(f: Flow, doc: ProposalDocDto): number {
  const ts = f.ts;
  const y = 30;
  const right = `Proposal ${doc.proposalNumber}`;
  const rw = ts.width(right, { size: 8.5 });
  const name = ts.wrap(doc.company.name, f.width - rw - 20, { size: 8.5, weight: "semibold" })[0] ?? "";
  ts.line(name, f.left, y, { size: 8.5, weight: "semibold", color: COLORS.accent });
  ts.line(right, f.left, y, { size: 8.5, color: COLORS.muted }, { align: "right", width: f.width });
  f.doc.save().moveTo(f.left, y + 16).lineTo(f.left + f.width, y + 16).lineWidth(0.5).strokeColor(COLORS.rule).stroke().restore();
  return y + 30;
}

function header(f: Flow, doc: ProposalDocDto): void {
  const ts = f.ts;
  const c = doc.company;
  const top = f.y;
  const markSize = 46;
  const boxW = 176;
  const textX = f.left + markSize + 14;
  const textW = f.width - markSize - 14 - boxW - 16;

  if (c.logoDataUrl) {
    try {
      f.doc.image(c.logoDataUrl, f.left, top, { fit: [markSize, markSize] });
    } catch {
      drawCompanyMark(ts, f.left, top, markSize, c.name);
    }
  } else drawCompanyMark(ts, f.left, top, markSize, c.name);

  let y = ts.block(c.name, textX, top - 2, textW, { size: 16, weight: "bold", color: COLORS.ink, leading: 1.2 });
  if (c.legalName && c.legalName !== c.name) y = ts.block(c.legalName, textX, y, textW, SMALL);
  const contact = [c.addressLines.join(", "), [c.phone, c.email].filter(Boolean).join("  ·  "), c.website ?? ""].filter(Boolean);
  for (const l of contact) y = ts.block(l, textX, y, textW, SMALL);
  if (c.licenceNumber) y = ts.block(`Licence ${c.licenceNumber}`, textX, y, textW, { ...SMALL, weight: "semibold" });

  // The proposal box on the right.
  const bx = f.left + f.width - boxW;
  const rows: [string, string][] = [
    ["Proposal", doc.proposalNumber + (doc.revisionNo > 1 ? ` · rev. ${doc.revisionNo}` : "")],
    ["Date", formatDate(doc.date)],
    ["Valid until", formatDate(doc.validUntil)],
  ];
  const pad = 10;
  const rowH = 26;
  const boxH = pad * 2 + rows.length * rowH - 4;
  f.doc.save().roundedRect(bx, top, boxW, boxH, 6).fill(COLORS.accentLight).restore();
  rows.forEach(([k, v], i) => {
    const ry = top + pad + i * rowH;
    ts.line(k.toUpperCase(), bx + pad, ry, LABEL);
    ts.line(ts.wrap(v, boxW - 2 * pad, { size: 10, weight: "semibold" })[0] ?? "", bx + pad, ry + 10, { size: 10, weight: "semibold", color: COLORS.ink, leading: 1.3 });
  });

  f.y = Math.max(y, top + boxH, top + markSize) + 14;
  f.doc.save().rect(f.left, f.y, f.width, 2.5).fill(COLORS.accent).restore();
  f.y += 16;
  const title = doc.status === "draft" || doc.status === "in_review" ? "Metal roof proposal (draft)" : "Metal roof proposal";
  f.y = ts.block(title, f.left, f.y, f.width, { size: 20, weight: "bold", color: COLORS.accent, leading: 1.2 });
  f.y += 8;
}

function parties(f: Flow, doc: ProposalDocDto): void {
  const ts = f.ts;
  const colW = (f.width - 20) / 2;
  const h = doc.homeowner;
  const left: [string, TextStyle][] = [
    [h.name, { size: 11, weight: "semibold", leading: 1.35 }],
    ...h.addressLines.map((l): [string, TextStyle] => [l, BODY]),
    ...[h.phone, h.email].filter((x): x is string => !!x).map((l): [string, TextStyle] => [l, SMALL]),
  ];
  const right: [string, TextStyle][] = doc.siteAddressLines.length
    ? doc.siteAddressLines.map((l, i): [string, TextStyle] => [l, i === 0 ? { size: 11, weight: "semibold", leading: 1.35 } : BODY])
    : [["Same as the homeowner's address", BODY]];
  const colHeight = (rows: [string, TextStyle][]) => 12 + rows.reduce((s, [t, st]) => s + ts.height(t, colW - 20, st), 0);
  const hgt = Math.max(colHeight(left), colHeight(right)) + 16;
  f.ensure(hgt);
  const draw = (x: number, label: string, rows: [string, TextStyle][]) => {
    f.doc.save().roundedRect(x, f.y, colW, hgt, 5).lineWidth(0.7).strokeColor(COLORS.rule).stroke().restore();
    let y = f.y + 9;
    ts.line(label.toUpperCase(), x + 10, y, LABEL);
    y += 12;
    for (const [t, st] of rows) y = ts.block(t, x + 10, y, colW - 20, st);
  };
  draw(f.left, "Prepared for", left);
  draw(f.left + colW + 20, "Project site", right);
  f.y += hgt;
}

function scope(f: Flow, doc: ProposalDocDto): void {
  const ts = f.ts;
  f.heading("Scope of work");
  f.text(`About ${formatSquares(doc.scope.totalSquares)} squares of roof (one square is 100 square feet of roof surface).`, SMALL, { after: 6 });
  for (const p of doc.scope.preparation) f.bullet(p, BODY);
  for (const area of doc.scope.areas) {
    const head = `${area.title} · ${formatSquares(area.squares)} squares`;
    f.heading(head, { size: 11, before: 12, keep: 60, color: COLORS.ink });
    const planes = area.planes.map((p) => `${p.number}. ${p.name} (${formatPitch(p.pitch)}, ${formatSquares(p.squares)} sq)`).join("   ");
    f.text(`Planes: ${planes}`, SMALL, { after: 6 });
    f.text("From the deck up:", { ...SMALL, weight: "semibold", color: COLORS.accent }, { after: 2 });
    const labelW = 118;
    area.layers.forEach((layer, i) => {
      const textW = f.width - labelW;
      const lines = ts.wrap(layer.sentences.join(" "), textW, BODY);
      const lh = ts.lineHeight(BODY);
      const titleLines = ts.wrap(`${i + 1}  ${layer.title}`, labelW - 12, { ...BODY, weight: "semibold" });
      f.ensure(lh * Math.min(Math.max(2, titleLines.length), lines.length + 1) + 4);
      const top = f.y;
      let ty = top;
      titleLines.forEach((l, k) => {
        if (k === 0) {
          const [num, ...rest] = l.split("  ");
          ts.line(num, f.left, ty, { ...BODY, weight: "bold", color: COLORS.copper });
          ts.line(rest.join("  "), f.left + 14, ty, { ...BODY, weight: "semibold" });
        } else ts.line(l, f.left + 14, ty, { ...BODY, weight: "semibold" });
        ty += lh;
      });
      for (const l of lines) {
        if (f.y + lh > f.bottom) {
          f.newPage();
          ty = f.y;
        }
        ts.line(l, f.left + labelW, f.y, BODY, { width: textW });
        f.y += lh;
      }
      f.y = Math.max(f.y, ty) + 5;
    });
  }
}

// ---------------------------------------------------------------------------------------------------
// the roof plan
// ---------------------------------------------------------------------------------------------------

/** Area-weighted centroid of a polygon (falls back to the vertex average). */
export function centroid(pts: readonly (readonly [number, number])[]): [number, number] {
  let a = 0, cx = 0, cy = 0;
  for (let i = 0; i < pts.length; i++) {
    const [x0, y0] = pts[i];
    const [x1, y1] = pts[(i + 1) % pts.length];
    const cr = x0 * y1 - x1 * y0;
    a += cr;
    cx += (x0 + x1) * cr;
    cy += (y0 + y1) * cr;
  }
  if (Math.abs(a) < 1e-9) return [pts.reduce((s, p) => s + p[0], 0) / pts.length, pts.reduce((s, p) => s + p[1], 0) / pts.length];
  return [cx / (3 * a), cy / (3 * a)];
}

/** Distance from a point to a segment. */
function distToSegment(px: number, py: number, a: readonly [number, number], b: readonly [number, number]): number {
  const dx = b[0] - a[0], dy = b[1] - a[1];
  const l2 = dx * dx + dy * dy;
  const t = l2 > 0 ? Math.max(0, Math.min(1, ((px - a[0]) * dx + (py - a[1]) * dy) / l2)) : 0;
  return Math.hypot(px - (a[0] + t * dx), py - (a[1] + t * dy));
}

function inside(px: number, py: number, pts: readonly (readonly [number, number])[]): boolean {
  let c = false;
  for (let i = 0, j = pts.length - 1; i < pts.length; j = i++) {
    const [xi, yi] = pts[i], [xj, yj] = pts[j];
    if (yi > py !== yj > py && px < ((xj - xi) * (py - yi)) / (yj - yi) + xi) c = !c;
  }
  return c;
}

/**
 * Where a label sits best: the inside point farthest from the outline (sampled on a grid, the centroid
 * first), so notched and L-shaped planes get their label inside their own area.
 */
export function labelPoint(pts: readonly (readonly [number, number])[]): { x: number; y: number; room: number } {
  const clearance = (x: number, y: number) => {
    let d = Infinity;
    for (let i = 0; i < pts.length; i++) d = Math.min(d, distToSegment(x, y, pts[i], pts[(i + 1) % pts.length]));
    return d;
  };
  const [cx, cy] = centroid(pts);
  let best = inside(cx, cy, pts) ? { x: cx, y: cy, room: clearance(cx, cy) } : { x: cx, y: cy, room: -1 };
  const xs = pts.map((p) => p[0]), ys = pts.map((p) => p[1]);
  const x0 = Math.min(...xs), x1 = Math.max(...xs), y0 = Math.min(...ys), y1 = Math.max(...ys);
  const n = 14;
  for (let i = 0; i <= n; i++)
    for (let j = 0; j <= n; j++) {
      const x = x0 + ((x1 - x0) * i) / n, y = y0 + ((y1 - y0) * j) / n;
      if (!inside(x, y, pts)) continue;
      const r = clearance(x, y);
      if (r > best.room * 1.25) best = { x, y, room: r };
    }
  return best;
}

/** A "nice" scale-bar length in feet for a drawing `spanFt` wide. */
export function scaleBarFeet(spanFt: number): number {
  const target = spanFt / 5;
  for (const n of [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500]) if (n >= target) return n;
  return 1000;
}

function plan(f: Flow, planes: PlanPlane[]): void {
  if (planes.length === 0) return;
  const ts = f.ts;
  const pdf = f.doc;
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const p of planes)
    for (const [x, y] of p.outline) {
      x0 = Math.min(x0, x); y0 = Math.min(y0, y); x1 = Math.max(x1, x); y1 = Math.max(y1, y);
    }
  const spanX = Math.max(x1 - x0, 1);
  const spanY = Math.max(y1 - y0, 1);
  const pad = 26;
  const boxW = f.width;
  const innerW = boxW - 2 * pad;
  const maxH = 330;
  const scale = Math.min(innerW / spanX, (maxH - 2 * pad) / spanY);
  const boxH = spanY * scale + 2 * pad + 18;
  const caption = "Plan view (looking down), north up. Numbers match the planes in the scope of work; the copper line marks each eave, and the small arrow points down the slope.";
  const capH = ts.height(caption, f.width, SMALL);

  f.heading("Roof plan", { keep: boxH + capH + 6 });
  f.text(caption, SMALL, { after: 6 });
  const bx = f.left;
  const by = f.y;
  pdf.save().roundedRect(bx, by, boxW, boxH, 6).lineWidth(0.7).strokeColor(COLORS.rule).stroke().restore();
  const ox = bx + pad + (innerW - spanX * scale) / 2;
  const oy = by + pad;
  const toPt = ([x, y]: readonly [number, number]): [number, number] => [ox + (x - x0) * scale, oy + (y1 - y) * scale];

  for (const p of planes) {
    const pts = p.outline.map(toPt);
    pdf.save();
    polygonPath(pdf, pts).lineWidth(0.9).lineJoin("round").fillAndStroke(COLORS.accentLight, COLORS.accent);
    const n = pts.length;
    const a = pts[p.eaveEdge % n];
    const b = pts[(p.eaveEdge + 1) % n];
    pdf.moveTo(a[0], a[1]).lineTo(b[0], b[1]).lineWidth(2.4).lineCap("round").strokeColor(COLORS.copper).stroke();
    pdf.restore();
  }
  for (const p of planes) {
    const pts = p.outline.map(toPt);
    const lp = labelPoint(pts);
    const cx = lp.x, cy = lp.y;
    const n = pts.length;
    const a = pts[p.eaveEdge % n];
    const b = pts[(p.eaveEdge + 1) % n];
    // Down-slope arrow: from the label toward the eave, perpendicular to it.
    const ex = b[0] - a[0], ey = b[1] - a[1];
    const el = Math.hypot(ex, ey) || 1;
    let nx = -ey / el, ny = ex / el;
    const mx = (a[0] + b[0]) / 2 - cx, my = (a[1] + b[1]) / 2 - cy;
    if (nx * mx + ny * my < 0) { nx = -nx; ny = -ny; }
    const small = lp.room < 17;
    const numStyle: TextStyle = { size: small ? 7 : 9, weight: "bold", color: COLORS.accent, leading: 1.1 };
    const pitchStyle: TextStyle = { size: 7, color: COLORS.muted, leading: 1.1 };
    const label = String(p.number);
    if (small) {
      ts.line(label, cx - 20, cy - 4, numStyle, { align: "center", width: 40 });
    } else {
      ts.line(label, cx - 30, cy - 10, numStyle, { align: "center", width: 60 });
      ts.line(formatPitch(p.pitch), cx - 30, cy + 1, pitchStyle, { align: "center", width: 60 });
      const ax = cx + nx * 16, ay = cy + ny * 16;
      const len = 8;
      pdf.save().moveTo(ax, ay).lineTo(ax + nx * len, ay + ny * len).lineWidth(0.8).strokeColor(COLORS.copper).stroke();
      const tx = ax + nx * (len + 3), ty = ay + ny * (len + 3);
      polygonPath(pdf, [[tx, ty], [ax + nx * len - ny * 2.5, ay + ny * len + nx * 2.5], [ax + nx * len + ny * 2.5, ay + ny * len - nx * 2.5]]).fill(COLORS.copper);
      pdf.restore();
    }
  }

  // North arrow (top right) and scale bar (bottom left).
  const nxp = bx + boxW - 20, nyp = by + 12;
  pdf.save();
  polygonPath(pdf, [[nxp, nyp], [nxp + 5, nyp + 14], [nxp, nyp + 11], [nxp - 5, nyp + 14]]).fill(COLORS.ink);
  pdf.restore();
  ts.line("N", nxp - 10, nyp + 15, { size: 7, weight: "bold", color: COLORS.ink }, { align: "center", width: 20 });
  const barFt = scaleBarFeet(spanX);
  const barW = barFt * scale;
  const sx = bx + 12, sy = by + boxH - 14;
  pdf.save().rect(sx, sy, barW, 3).fill(COLORS.ink).restore();
  ts.line(`${barFt} ft`, sx + barW + 5, sy - 4, { size: 7, color: COLORS.muted });
  const legendX = bx + boxW - 150;
  pdf.save().moveTo(legendX, sy + 1).lineTo(legendX + 16, sy + 1).lineWidth(2.4).strokeColor(COLORS.copper).stroke().restore();
  ts.line("Eave", legendX + 20, sy - 4, { size: 7, color: COLORS.muted });
  pdf.save().rect(legendX + 50, sy - 3, 10, 8).lineWidth(0.7).fillAndStroke(COLORS.accentLight, COLORS.accent).restore();
  ts.line("Plane no. and pitch", legendX + 64, sy - 4, { size: 7, color: COLORS.muted });
  f.y = by + boxH + 6;
}

// ---------------------------------------------------------------------------------------------------
// options and terms
// ---------------------------------------------------------------------------------------------------

function optionsTable(f: Flow, doc: ProposalDocDto): void {
  const ts = f.ts;
  const cols = [
    { key: "option", title: "Option", w: 0 },
    { key: "price", title: "Price", w: 78 },
    { key: "tax", title: "Tax", w: 64 },
    { key: "total", title: "Total", w: 82 },
    { key: "deposit", title: `Deposit (${formatPercent(doc.depositPct)})`, w: 84 },
  ];
  cols[0].w = f.width - cols.slice(1).reduce((s, c) => s + c.w, 0);
  const pad = 7;
  const headStyle: TextStyle = { size: 8, weight: "semibold", color: "#ffffff", leading: 1.3 };
  const headH = 20;
  const drawHead = () => {
    f.doc.save().rect(f.left, f.y, f.width, headH).fill(COLORS.accent).restore();
    let x = f.left;
    cols.forEach((c, i) => {
      ts.line(c.title, x + pad, f.y + 5, headStyle, i === 0 ? {} : { align: "right", width: c.w - 2 * pad });
      x += c.w;
    });
    f.y += headH;
  };
  const chosenId = doc.acceptance?.optionId ?? null;
  const rows = doc.options.map((o, i) => {
    const labelStyle: TextStyle = { size: 10, weight: "semibold", leading: 1.3 };
    const textW = cols[0].w - 2 * pad;
    const label = `${doc.options.length > 1 ? `${i + 1}. ` : ""}${o.label}${o.id === chosenId ? " (chosen)" : ""}`;
    const labelLines = ts.wrap(label, textW, labelStyle);
    const diffs = o.differences.map((d) => ts.wrap(d, textW - 10, SMALL));
    const h = pad + labelLines.length * ts.lineHeight(labelStyle) + 2 + diffs.reduce((s, l) => s + l.length * ts.lineHeight(SMALL), 0) + pad;
    return { o, labelLines, labelStyle, diffs, h: Math.max(h, 34) };
  });

  f.heading("Your options and prices", { keep: headH + (rows[0]?.h ?? 40) });
  if (doc.options.length > 1) f.text("Each option is the complete roof described above, with the differences listed. Choose one when you accept.", SMALL, { after: 6 });
  drawHead();
  rows.forEach((r, i) => {
    if (f.y + r.h > f.bottom) {
      f.newPage();
      drawHead();
    }
    const top = f.y;
    const chosen = r.o.id === chosenId;
    if (chosen) f.doc.save().rect(f.left, top, f.width, r.h).fill(COLORS.okFill).restore();
    else if (i % 2 === 1) f.doc.save().rect(f.left, top, f.width, r.h).fill(COLORS.zebra).restore();
    let y = top + pad;
    for (const l of r.labelLines) {
      ts.line(l, f.left + pad, y, { ...r.labelStyle, color: chosen ? COLORS.okLine : COLORS.ink });
      y += ts.lineHeight(r.labelStyle);
    }
    y += 2;
    for (const lines of r.diffs) {
      lines.forEach((l, k) => {
        if (k === 0) ts.line("–", f.left + pad, y, SMALL);
        ts.line(l, f.left + pad + 10, y, SMALL);
        y += ts.lineHeight(SMALL);
      });
    }
    let x = f.left + cols[0].w;
    const money: [number, TextStyle][] = [
      [r.o.priceCents, { size: 9.5 }],
      [r.o.taxCents, { size: 9.5, color: COLORS.muted }],
      [r.o.totalCents, { size: 10, weight: "bold" }],
      [r.o.depositCents, { size: 9.5, weight: "semibold", color: COLORS.accent }],
    ];
    money.forEach(([cents, st], k) => {
      ts.line(formatMoney(cents), x + pad, top + pad, st, { align: "right", width: cols[k + 1].w - 2 * pad });
      x += cols[k + 1].w;
    });
    f.doc.save().moveTo(f.left, top + r.h).lineTo(f.left + f.width, top + r.h).lineWidth(0.5).strokeColor(COLORS.rule).stroke().restore();
    f.y = top + r.h;
  });
  f.gap(6);
  f.text("Prices include all labour, materials, disposal and cleanup described in the scope of work. Tax is figured as the law of your area requires.", SMALL);
}

function terms(f: Flow, doc: ProposalDocDto): void {
  f.heading("Deposit and payment");
  const depositLine =
    doc.options.length === 1
      ? `Deposit due on acceptance: ${formatMoney(doc.options[0].depositCents)} (${formatPercent(doc.depositPct)} of ${formatMoney(doc.options[0].totalCents)}).`
      : `Deposit due on acceptance: ${formatPercent(doc.depositPct)} of the option you choose (from ${formatMoney(Math.min(...doc.options.map((o) => o.depositCents)))} to ${formatMoney(Math.max(...doc.options.map((o) => o.depositCents)))}, as listed above).`;
  f.text(depositLine, { ...BODY, weight: "semibold" }, { after: 4 });
  for (const t of doc.paymentTerms) f.bullet(t, BODY);
  f.text(`This proposal is valid until ${formatDate(doc.validUntil)}.`, { ...BODY, weight: "semibold", color: COLORS.accent }, { after: 2 });
  f.heading("Not included", { size: 12 });
  for (const t of doc.exclusions) f.bullet(t, BODY);
  f.heading("Warranty", { size: 12 });
  for (const t of doc.warranty) f.bullet(t, BODY);
}

/** The safety and code box: measured whole and kept on one page. */
export function cautions(f: Flow, c: ProposalDocDto["cautions"], title = "Safety and codes"): void {
  const ts = f.ts;
  const pad = 12;
  const innerW = f.width - 2 * pad - 6;
  const titleStyle: TextStyle = { size: 11.5, weight: "bold", color: "#7a4b06", leading: 1.3 };
  const itemTitle: TextStyle = { size: 9.5, weight: "bold", color: COLORS.ink, leading: 1.4 };
  const itemText: TextStyle = BODY;
  const govern: TextStyle = { ...BODY, weight: "semibold" };
  const h =
    pad +
    ts.height(title, innerW, titleStyle) +
    4 +
    c.items.reduce((s, it) => s + ts.height(it.title, innerW, itemTitle) + ts.height(it.text, innerW, itemText) + 4, 0) +
    4 +
    ts.height(c.governs, innerW, govern) +
    pad;
  f.y += 16;
  f.ensure(h);
  const top = f.y;
  f.doc.save().rect(f.left, top, f.width, h).fill(COLORS.cautionFill).rect(f.left, top, 5, h).fill(COLORS.cautionLine).restore();
  f.doc.save().rect(f.left, top, f.width, h).lineWidth(0.8).strokeColor(COLORS.cautionLine).stroke().restore();
  const x = f.left + pad + 6;
  let y = ts.block(title, x, top + pad, innerW, titleStyle) + 4;
  for (const it of c.items) {
    y = ts.block(it.title, x, y, innerW, itemTitle);
    y = ts.block(it.text, x, y, innerW, itemText) + 4;
  }
  y += 4;
  ts.block(c.governs, x, y, innerW, govern);
  f.y = top + h;
}

function acceptance(f: Flow, doc: ProposalDocDto): void {
  const ts = f.ts;
  const pad = 14;
  const innerW = f.width - 2 * pad;
  const titleStyle: TextStyle = { size: 13, weight: "bold", color: COLORS.accent, leading: 1.3 };
  const linkStyle: TextStyle = { size: 9.5, color: COLORS.link, leading: 1.4 };
  const a = doc.acceptance;
  const parts: { text: string; style: TextStyle; link?: string }[] = [];
  if (a) {
    parts.push({ text: "Accepted", style: { ...titleStyle, color: COLORS.okLine } });
    parts.push({ text: `Signed by: ${a.signerName}`, style: { ...BODY, weight: "semibold" } });
    parts.push({ text: `Accepted: ${formatDateTimeUtc(a.acceptedAt)}`, style: BODY });
    parts.push({ text: `Option chosen: ${a.optionLabel}`, style: BODY });
    parts.push({ text: "The homeowner typed their full name and gave consent online; the signed copy is kept with its fingerprint. Proposal page:", style: SMALL });
    parts.push({ text: doc.acceptUrl, style: linkStyle, link: doc.acceptUrl });
  } else {
    parts.push({ text: "Accept this proposal", style: titleStyle });
    parts.push({
      text: `To accept, open your proposal page below, choose ${doc.options.length > 1 ? "an option" : "the option"}, type your full name and confirm. You can pay the deposit there by card right after.`,
      style: BODY,
    });
    parts.push({ text: doc.acceptUrl, style: { ...linkStyle, weight: "semibold" }, link: doc.acceptUrl });
    const contact = [doc.company.phone, doc.company.email].filter(Boolean).join(" or ");
    parts.push({ text: `The link is private to you${contact ? `. Questions? Contact us at ${contact}` : ""}. This proposal is valid until ${formatDate(doc.validUntil)}.`, style: SMALL });
  }
  const h = pad * 2 + parts.reduce((s, p) => s + ts.height(p.text, innerW, p.style) + 3, 0);
  f.y += 16;
  f.ensure(h);
  const top = f.y;
  f.doc
    .save()
    .roundedRect(f.left, top, f.width, h, 6)
    .lineWidth(1.2)
    .fillAndStroke(a ? COLORS.okFill : "#ffffff", a ? COLORS.okLine : COLORS.accent)
    .restore();
  let y = top + pad;
  for (const p of parts) y = ts.block(p.text, f.left + pad, y, innerW, p.style, p.link ? { link: p.link } : {}) + 3;
  f.y = top + h;
}
