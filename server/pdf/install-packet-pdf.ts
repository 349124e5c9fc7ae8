/**
 * The crew's install packet PDF: job and site, safety first, the layer stack in install order per area,
 * then one block per plane (zone diagram, cut list, fasteners by zone), trim, other materials, photo
 * slots and advisories. "Page N of M" on every page.
 */
import { formatDate, formatFeetInches, formatInchesAsFeet, formatPitch, formatSquares } from "../../shared/schemas/proposal";
import type { InstallPacketDocDto, InstallPlane, ZoneDiagram, ZoneFastenerRow } from "../../shared/schemas/install-packet";
import { zoneListText } from "../../shared/engine/format";
import { loadInterFonts, type FontFamily } from "./fonts";
import { cautions, labelPoint } from "./proposal-pdf";
import { COLORS, Flow, Typesetter, drawCompanyMark, drawPageFooters, newDocument, polygonPath, type Doc, type TextStyle } from "./typeset";

const MARGINS = { top: 46, bottom: 56, left: 44, right: 44 };
const BODY: TextStyle = { size: 9, color: COLORS.ink, leading: 1.4 };
const SMALL: TextStyle = { size: 8, color: COLORS.muted, leading: 1.35 };
const NOTE: TextStyle = { size: 8.5, color: "#7a4b06", leading: 1.38, weight: "semibold" };

export const ZONE_COLORS: Record<string, string> = { "1'": "#f7f9fa", "1": "#e4edf2", "2": "#9dc1d3", "3": "#3f7d9b" };

/** Photo bytes (JPEG or PNG) by attachment id, drawn into the photo slots that name them. */
export type PacketImages = Record<number, Uint8Array>;

export async function renderInstallPacketPdf(doc: InstallPacketDocDto, opts: { fonts?: FontFamily; images?: PacketImages } = {}): Promise<Buffer> {
  const { doc: pdf, finish } = newDocument({ title: `Install packet ${doc.reference}`, author: doc.company.name, created: new Date(`${doc.date}T12:00:00Z`) });
  const ts = new Typesetter(pdf, opts.fonts ?? loadInterFonts());
  const flow = new Flow(ts, {
    margins: MARGINS,
    onNewPage: (f) => {
      const y = 26;
      ts.line(`Install packet · ${doc.reference}`, f.left, y, { size: 8.5, weight: "semibold", color: COLORS.accent });
      const addr = doc.siteAddressLines[0] ?? doc.customerName;
      ts.line(ts.wrap(addr, f.width / 2, { size: 8.5 })[0] ?? "", f.left, y, { size: 8.5, color: COLORS.muted }, { align: "right", width: f.width });
      f.doc.save().moveTo(f.left, y + 16).lineTo(f.left + f.width, y + 16).lineWidth(0.5).strokeColor(COLORS.rule).stroke().restore();
      return y + 28;
    },
  });

  header(flow, doc);
  cautions(flow, doc.cautions, "Safety first");
  flow.heading("Before you start");
  for (const p of doc.preparation) flow.bullet(p, BODY);

  for (const area of doc.areas) {
    flow.heading(`Layer stack in install order: ${area.title}`, { keep: 80 });
    flow.text(`${formatSquares(area.squares)} squares · planes ${area.planeNumbers.join(", ")}`, SMALL, { after: 4 });
    area.steps.forEach((s, i) => {
      const lh = ts.lineHeight(BODY);
      flow.ensure(lh * 3);
      flow.text(`${i + 1}. ${s.title}`, { ...BODY, weight: "bold", color: COLORS.accent });
      flow.text(s.text, BODY, { indent: 14 });
      for (const n of s.notes) flow.bullet(n, NOTE, { indent: 14, after: 1, marker: "!" });
      flow.gap(4);
    });
  }

  flow.heading("Planes: cut list and fasteners by wind zone", { keep: 200 });
  flow.text(doc.windNote, SMALL, { after: 4 });
  zoneLegend(flow);
  for (const p of doc.planes) planeBlock(flow, p);

  flow.heading("Fasteners, whole roof", { keep: 80 });
  fastenerTable(flow, doc.fastenerTotals, flow.left, flow.width, false);

  flow.heading("Trim pieces", { keep: 60 });
  materialTable(flow, doc.trim);
  flow.heading("Other materials", { keep: 60 });
  materialTable(flow, doc.otherMaterials);

  flow.heading("Photos for the crew", { keep: 40 });
  if (doc.photoSlots.length === 0) flow.text("No photos flagged for the crew yet.", SMALL);
  else photoSlots(flow, doc.photoSlots, opts.images ?? {});

  if (doc.advisories.length) {
    flow.heading("Checks from the takeoff", { keep: 40 });
    for (const a of doc.advisories) flow.bullet(`${a.severity === "error" ? "Must fix" : "Check"}: ${a.message} (${a.reference})`, BODY);
  }
  flow.gap(8);
  flow.text(doc.cautions.governs, { ...BODY, weight: "semibold" });

  drawPageFooters(ts, MARGINS, `${doc.company.name} · Install packet ${doc.reference} · ${formatDate(doc.date)}`);
  return finish();
}

function header(f: Flow, doc: InstallPacketDocDto): void {
  const ts = f.ts;
  const top = f.y;
  drawCompanyMark(ts, f.left, top, 38, doc.company.name);
  const x = f.left + 50;
  const w = f.width - 50;
  let y = ts.block("Install packet", x, top - 2, w, { size: 18, weight: "bold", color: COLORS.accent, leading: 1.2 });
  y = ts.block([doc.company.name, doc.company.phone, doc.company.licenceNumber ? `Licence ${doc.company.licenceNumber}` : null].filter(Boolean).join(" · "), x, y, w, SMALL);
  f.y = Math.max(y, top + 38) + 10;
  const rows: [string, string][] = [
    ["Job", `${doc.reference}${doc.optionLabel ? ` · option: ${doc.optionLabel}` : ""}`],
    ["Date", formatDate(doc.date)],
    ["Homeowner", [doc.customerName, doc.customerPhone].filter(Boolean).join(" · ")],
    ["Site", doc.siteAddressLines.join(", ") || "—"],
    ["Crew", doc.crew.join(", ") || "—"],
  ];
  const labelW = 72;
  const h = rows.reduce((s, [, v]) => s + ts.height(v, f.width - labelW - 20, BODY), 0) + 16;
  f.ensure(h);
  f.doc.save().roundedRect(f.left, f.y, f.width, h, 5).fill(COLORS.accentLight).restore();
  y = f.y + 8;
  for (const [k, v] of rows) {
    ts.line(k.toUpperCase(), f.left + 10, y + 1, { size: 7.5, weight: "semibold", color: COLORS.faint });
    y = ts.block(v, f.left + 10 + labelW, y, f.width - labelW - 20, { ...BODY, weight: k === "Site" ? "semibold" : "regular" });
  }
  f.y += h;
}

function zoneLegend(f: Flow): void {
  const ts = f.ts;
  f.ensure(16);
  let x = f.left;
  for (const [z, label] of [["1", "Zone 1 (field)"], ["2", "Zone 2 (edge)"], ["3", "Zone 3 (corner)"], ["1'", "Zone 1' (low slope, inner field)"]] as const) {
    f.doc.save().rect(x, f.y + 2, 11, 9).lineWidth(0.5).fillAndStroke(ZONE_COLORS[z], COLORS.faint).restore();
    x += 15;
    x += ts.line(label, x, f.y, SMALL) + 14;
  }
  f.doc.save().moveTo(x, f.y + 7).lineTo(x + 14, f.y + 7).lineWidth(2.2).strokeColor(COLORS.copper).stroke().restore();
  ts.line("Eave", x + 18, f.y, SMALL);
  f.y += 16;
}

/** Points of a stadium (all points within r of segment ab) as a polygon. */
export function stadium(a: readonly [number, number], b: readonly [number, number], r: number, steps = 8): [number, number][] {
  const dx = b[0] - a[0], dy = b[1] - a[1];
  const base = Math.atan2(dy, dx);
  const pts: [number, number][] = [];
  for (let i = 0; i <= steps; i++) {
    const t = base - Math.PI / 2 + (Math.PI * i) / steps;
    pts.push([b[0] + r * Math.cos(t), b[1] + r * Math.sin(t)]);
  }
  for (let i = 0; i <= steps; i++) {
    const t = base + Math.PI / 2 + (Math.PI * i) / steps;
    pts.push([a[0] + r * Math.cos(t), a[1] + r * Math.sin(t)]);
  }
  return pts;
}

/**
 * The zone diagram: the plane clipped to its outline, zone 1 (or 1') as the base, zone 2 bands within
 * the zone 2 width of each roof edge, zone 3 where the bands of two edges meeting at a corner overlap.
 */
function drawZones(pdf: Doc, p: InstallPlane, z: ZoneDiagram, toPt: (q: readonly [number, number]) => [number, number], scale: number): void {
  const outline = p.outline.map(toPt);
  pdf.save();
  polygonPath(pdf, outline).clip();
  polygonPath(pdf, outline).fill(z.model === "low-slope" ? ZONE_COLORS["1'"] : ZONE_COLORS["1"]);
  const band = (i: number, r: number) => stadium(toPt(z.roofEdges[i].from), toPt(z.roofEdges[i].to), r * scale);
  if (z.model === "low-slope" && z.zone1PlanFt) for (let i = 0; i < z.roofEdges.length; i++) polygonPath(pdf, band(i, z.zone1PlanFt)).fill(ZONE_COLORS["1"]);
  for (let i = 0; i < z.roofEdges.length; i++) polygonPath(pdf, band(i, z.zone2PlanFt)).fill(ZONE_COLORS["2"]);
  const [r3a, r3b] = z.zone3PlanFt;
  const zone3Color = z.zone3AsZone2 ? ZONE_COLORS["2"] : ZONE_COLORS["3"];
  for (const [i, j] of z.corners) {
    for (const [ri, rj] of [[r3b, z.zone2PlanFt], [z.zone2PlanFt, r3b]] as const) {
      pdf.save();
      polygonPath(pdf, band(i, ri === r3b ? Math.min(r3a, r3b) : ri)).clip();
      polygonPath(pdf, band(j, rj === r3b ? Math.min(r3a, r3b) : rj)).fill(zone3Color);
      pdf.restore();
    }
  }
  pdf.restore();
  pdf.save();
  polygonPath(pdf, outline).lineWidth(0.9).lineJoin("round").strokeColor(COLORS.ink).stroke();
  const n = outline.length;
  const a = outline[p.eaveEdge % n], b = outline[(p.eaveEdge + 1) % n];
  pdf.moveTo(a[0], a[1]).lineTo(b[0], b[1]).lineWidth(2.4).lineCap("round").strokeColor(COLORS.copper).stroke();
  pdf.restore();
}

function planeBlock(f: Flow, p: InstallPlane): void {
  const ts = f.ts;
  const diagramW = 210;
  const diagramH = 150;
  const gap = 16;
  const tableX = f.left + diagramW + gap;
  const tableW = f.width - diagramW - gap;
  const title = `${p.number}. ${p.name}`;
  const sub = `${formatPitch(p.pitch)} · ${formatSquares(p.squares)} sq · ${p.stackTitle} · ${p.panelCount} panels, ${Number(p.coverageWidthIn.toFixed(2))} in coverage`;
  const titleStyle: TextStyle = { size: 10.5, weight: "bold", color: COLORS.ink, leading: 1.3 };
  const cutRows = p.cutList.length;
  const zoneRows = p.fasteners.length;
  const rowH = ts.lineHeight(BODY);
  const tablesH = rowH * (cutRows + 1) + 10 + rowH * (zoneRows + 1) + 8 + (p.spacingLimitedByBattens.length ? rowH * 2 : 0);
  const headH = ts.height(title, f.width, titleStyle) + ts.height(sub, f.width, SMALL) + 4;
  const blockH = headH + Math.max(diagramH, tablesH) + 14;
  f.y += 8;
  if (blockH <= f.bottom - (MARGINS.top + 28)) f.ensure(blockH);
  else f.ensure(headH + diagramH + 20);
  f.rule();
  f.y += 6;
  f.y = ts.block(title, f.left, f.y, f.width, titleStyle);
  f.y = ts.block(sub, f.left, f.y, f.width, SMALL) + 4;
  const top = f.y;

  // Diagram.
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const [x, y] of p.outline) {
    x0 = Math.min(x0, x); y0 = Math.min(y0, y); x1 = Math.max(x1, x); y1 = Math.max(y1, y);
  }
  const pad = 10;
  const scale = Math.min((diagramW - 2 * pad) / Math.max(x1 - x0, 1), (diagramH - 2 * pad - 10) / Math.max(y1 - y0, 1));
  const ox = f.left + pad + (diagramW - 2 * pad - (x1 - x0) * scale) / 2;
  const oy = top + pad;
  const toPt = ([x, y]: readonly [number, number]): [number, number] => [ox + (x - x0) * scale, oy + (y1 - y) * scale];
  f.doc.save().roundedRect(f.left, top, diagramW, diagramH, 4).lineWidth(0.6).strokeColor(COLORS.rule).stroke().restore();
  drawZones(f.doc, p, p.zoneDiagram, toPt, scale);
  const lp = labelPoint(p.outline.map(toPt));
  ts.line(String(p.number), lp.x - 20, lp.y - 6, { size: 9, weight: "bold", color: COLORS.ink }, { align: "center", width: 40 });
  ts.line(`a = ${formatFeetInches(p.zoneDiagram.zone2PlanFt)} (plan) · north up`, f.left + 6, top + diagramH - 13, { size: 7, color: COLORS.muted });

  // Tables.
  let y = top;
  const cutCols = [tableW * 0.5, tableW * 0.5];
  y = tableHead(f, tableX, y, ["Panel length", "Count"], cutCols);
  for (const c of p.cutList) {
    ts.line(`${formatInchesAsFeet(c.lengthIn)} (${c.lengthIn} in)`, tableX + 4, y, BODY);
    ts.line(String(c.count), tableX + cutCols[0], y, { ...BODY, weight: "semibold" }, { align: "right", width: cutCols[1] - 6 });
    y += rowH;
  }
  y += 10;
  f.y = y;
  const endY = fastenerTable(f, p.fasteners, tableX, tableW, p.system === "standing-seam");
  y = endY;
  if (p.spacingLimitedByBattens.length) {
    y = ts.block(`Batten spacing sets the clip spacing in ${zoneListText(p.spacingLimitedByBattens)}: check the panel maker's schedule.`, tableX, y + 4, tableW, NOTE);
  }
  f.y = Math.max(top + diagramH, y) + 6;
}

function tableHead(f: Flow, x: number, y: number, titles: string[], widths: number[]): number {
  const ts = f.ts;
  const h = ts.lineHeight(BODY) + 2;
  f.doc.save().rect(x, y, widths.reduce((s, w) => s + w, 0), h).fill(COLORS.accent).restore();
  let cx = x;
  titles.forEach((t, i) => {
    ts.line(t, cx + 4, y + 1, { size: 8, weight: "semibold", color: "#ffffff", leading: 1.4 }, i === 0 ? {} : { align: "right", width: widths[i] - 6 });
    cx += widths[i];
  });
  return y + h + 1;
}

/** Fasteners by zone at (x, f.y); returns the y below the table. */
function fastenerTable(f: Flow, rows: ZoneFastenerRow[], x: number, width: number, showSpacing: boolean): number {
  const ts = f.ts;
  const cols = showSpacing ? [0.22, 0.2, 0.18, 0.2, 0.2] : [0.3, 0.2, 0.25, 0.25];
  const widths = cols.map((c) => c * width);
  const titles = showSpacing ? ["Zone", "Clip spacing", "Clips", "Screws", "Clip line"] : ["Zone", "Clips", "Screws", "Clip line"];
  const rowH = ts.lineHeight(BODY);
  if (f.y + rowH * (rows.length + 2) > f.bottom) f.newPage();
  let y = tableHead(f, x, f.y, titles, widths);
  for (const r of rows) {
    const cells = [
      `Zone ${r.zone}`,
      ...(showSpacing ? [r.spacingIn ? `${Number(r.spacingIn.toFixed(1))} in` : "—"] : []),
      String(r.clips),
      String(r.screws),
      formatFeetInches(r.lineFt),
    ];
    let cx = x;
    f.doc.save().rect(x + 2, y + 3, 7, 7).fill(ZONE_COLORS[r.zone]).restore();
    cells.forEach((c, i) => {
      if (i === 0) ts.line(c, cx + 13, y, BODY);
      else ts.line(c, cx, y, BODY, { align: "right", width: widths[i] - 6 });
      cx += widths[i];
    });
    y += rowH;
  }
  f.y = y + 4;
  return f.y;
}

function materialTable(f: Flow, rows: InstallPacketDocDto["trim"]): void {
  const ts = f.ts;
  if (rows.length === 0) {
    f.text("None.", SMALL);
    return;
  }
  const widths = [f.width * 0.46, f.width * 0.12, f.width * 0.42];
  const head = () => {
    f.y = tableHead(f, f.left, f.y, ["Item", "Qty", "How counted"], widths);
  };
  head();
  rows.forEach((r, i) => {
    const descLines = ts.wrap(r.description, widths[0] - 8, BODY);
    const basisLines = ts.wrap(r.basis, widths[2] - 8, SMALL);
    const h = Math.max(descLines.length * ts.lineHeight(BODY), basisLines.length * ts.lineHeight(SMALL)) + 4;
    if (f.y + h > f.bottom) {
      f.newPage();
      head();
    }
    if (i % 2) f.doc.save().rect(f.left, f.y, f.width, h).fill(COLORS.zebra).restore();
    let y = f.y + 2;
    for (const l of descLines) y = ts.block(l, f.left + 4, y, widths[0] - 8, BODY);
    ts.line(`${r.quantity} ${r.unit}`, f.left + widths[0], f.y + 2, { ...BODY, weight: "semibold" }, { align: "right", width: widths[1] - 6 });
    let by = f.y + 2;
    for (const l of basisLines) by = ts.block(l, f.left + widths[0] + widths[1] + 6, by, widths[2] - 8, SMALL);
    f.y += h;
  });
}

/** JPEG (FF D8) or PNG (89 50 4E 47): the formats pdfkit embeds. */
function embeddable(b: Uint8Array | undefined): b is Uint8Array {
  if (!b || b.length < 8) return false;
  if (b[0] === 0xff && b[1] === 0xd8) return true;
  return b[0] === 0x89 && b[1] === 0x50 && b[2] === 0x4e && b[3] === 0x47;
}

function photoSlots(f: Flow, slots: InstallPacketDocDto["photoSlots"], images: PacketImages): void {
  const ts = f.ts;
  const boxW = 150;
  const boxH = 112;
  for (const s of slots) {
    const capW = f.width - boxW - 14;
    const capH = ts.height(s.caption, capW, BODY);
    const h = Math.max(boxH, capH) + 10;
    f.ensure(h);
    const img = s.attachmentId != null ? images[s.attachmentId] : undefined;
    let drawn = false;
    if (embeddable(img)) {
      try {
        const buf = Buffer.from(img.buffer, img.byteOffset, img.byteLength);
        f.doc.save().rect(f.left, f.y, boxW, boxH).fill(COLORS.zebra).restore();
        f.doc.image(buf, f.left, f.y, { fit: [boxW, boxH], align: "center", valign: "center" });
        f.doc.save().rect(f.left, f.y, boxW, boxH).lineWidth(0.5).strokeColor(COLORS.rule).stroke().restore();
        drawn = true;
      } catch {
        drawn = false; // an unreadable image leaves the empty slot below
      }
    }
    if (!drawn) {
      f.doc.save().rect(f.left, f.y, boxW, boxH).dash(3, { space: 3 }).lineWidth(0.7).strokeColor(COLORS.faint).stroke().undash().restore();
      ts.line(s.attachmentId ? `Photo #${s.attachmentId}` : "Photo", f.left, f.y + boxH / 2 - 6, { size: 8, color: COLORS.faint }, { align: "center", width: boxW });
    }
    ts.block(s.caption, f.left + boxW + 14, f.y + 2, capW, BODY);
    f.y += h;
  }
}
