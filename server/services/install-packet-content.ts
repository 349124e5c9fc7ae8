/**
 * The crew's install packet from the job, the roof snapshot and the stored takeoff (the option being
 * built). Pure: plain objects in, InstallPacketDocDto out; no prices.
 */
import { rulesSchema, siteSchema, stackSchema, type StackInput } from "../../shared/schemas/takeoff";
import { formatFeetInches, formatInchesAsFeet, formatPitch } from "../../shared/schemas/proposal";
import type { InstallArea, InstallPacketDocDto, InstallPlane, InstallStep, ZoneFastenerRow } from "../../shared/schemas/install-packet";
import { planeRoofEdges, zoneKey, WIND_ZONES, type WindZone } from "../../shared/engine/wind/zones";
import type { EdgePiece } from "../../shared/engine/roof/edges";
import type { PlaneResult, TakeoffResult } from "../../shared/engine/types";
import { addressLines, spacerChoice, type ContentRoofInput } from "./proposal-content";

export interface InstallPacketInput {
  company: { name: string; phone?: string | null; licenceNumber?: string | null };
  job: {
    id: number;
    customerName: string;
    customerPhone?: string | null;
    siteAddressLine1?: string | null;
    siteAddressLine2?: string | null;
    siteCity?: string | null;
    siteRegion?: string | null;
    sitePostalCode?: string | null;
    site?: unknown;
    crew?: { name: string }[];
  };
  roof: ContentRoofInput;
  takeoff: TakeoffResult;
  /** The takeoff's rules (laps, screws per clip); defaults when left out. */
  rules?: unknown;
  reference?: string;
  optionLabel?: string | null;
  /** ISO date of the packet. */
  date: string;
  /** Photos flagged for the crew. */
  photos?: { caption: string; attachmentId?: number | null }[];
}

const clean = (s: string | null | undefined) => (s ?? "").trim();
const inch = (x: number) => `${Number(x.toFixed(2))} in`;

/** Install steps for one stack, in order, with the notes that matter on site. */
export function installSteps(stack: StackInput, planes: PlaneResult[], t: TakeoffResult, rules: ReturnType<typeof rulesSchema.parse>): InstallStep[] {
  const steps: InstallStep[] = [];
  const sr = t.stacks.find((s) => s.id === stack.id);
  const ch = sr?.channel;
  const deck = stack.deck;
  steps.push({
    title: "Deck",
    text:
      deck.action === "replace"
        ? `Install new ${inch(deck.thicknessIn)} ${deck.material === "osb" ? "OSB" : "plywood"} deck sheets.`
        : deck.action === "repair"
          ? `Inspect the deck; replace damaged sheets (allowance about ${deck.repairSharePct}% of the deck) and re-nail loose ones.`
          : "Inspect the deck and re-nail loose sheets; report damaged wood to the office before replacing it.",
    notes: ["Deck must be dry, flat and sound before any underlayment goes down."],
  });
  const ice = planes.map((p) => p.layers.iceBarrier).find((x) => x);
  if (ice) {
    const ib = rules.iceBarrier;
    steps.push({
      title: "Ice barrier at the eaves",
      text:
        ice.courses > 0
          ? `Self-adhered ice barrier along every eave, ${ice.courses} ${ice.courses === 1 ? "course" : "courses"}, ${formatFeetInches(ice.widthIn / 12)} up the slope.`
          : `No separate ice barrier: the self-adhered underlayment covers the eaves (${formatFeetInches(ice.widthIn / 12)} up the slope needed).`,
      notes: [
        `Reach at least ${ib.insideWallIn} in inside the exterior wall line (IRC R905.1.2).`,
        `Side laps ${inch(ib.sideLapIn)}, end laps ${inch(ib.endLapIn)}.`,
        ...(ice.note ? [ice.note] : []),
      ],
    });
  }
  const u = stack.underlayment;
  const roll = u.kind === "synthetic" ? rules.underlayment.synthetic : u.kind === "self-adhered" ? rules.underlayment.selfAdhered : u.feltNumber === 15 ? rules.underlayment.felt15 : rules.underlayment.felt30;
  steps.push({
    title: "Underlayment",
    text: `${u.kind === "synthetic" ? "Synthetic" : u.kind === "self-adhered" ? "Self-adhered" : `No. ${u.feltNumber} felt`} underlayment over the whole deck${u.layers > 1 ? ", two layers" : ""}${u.highTemp && u.kind !== "felt" ? " (high-temperature rated)" : ""}.`,
    notes: [`Lay from the eave up, upper courses over lower ones; side laps ${inch(roll.sideLapIn)}, end laps ${inch(roll.endLapIn)}.`],
  });
  const foil = stack.radiantBarrier.kind === "foil";
  const gap = ch?.gapIn ?? 0;
  const foilStep = (): InstallStep => ({
    title: "Radiant barrier (foil)",
    text: stack.radiantBarrier.position === "on-deck" ? "Foil over the underlayment, under the spacer." : "Foil fastened under the panels, over the spacer.",
    notes: [
      stack.radiantBarrier.position === "on-deck" ? "FOIL FACE UP, toward the air gap." : "FOIL FACE DOWN, toward the air gap.",
      "The reflective face must face open air: a face pressed against panels or deck does nothing.",
      `Side laps ${inch(rules.foil.sideLapIn)}, end laps ${inch(rules.foil.endLapIn)}; do not tear the foil.`,
      ...(gap > 0 ? [] : ["No air gap in this assembly: check with the office before installing foil."]),
    ],
  });
  if (foil && stack.radiantBarrier.position === "on-deck") steps.push(foilStep());

  const choice = spacerChoice(stack);
  const b = stack.spacer.battens;
  if (choice !== "none") {
    const notes: string[] = [];
    let text = "";
    if (choice === "battens" || choice === "counter-battens") {
      const cbSpacing = b.counterBattenSpacingIn ?? rules.battens.counterBattenSpacingIn;
      if (choice === "counter-battens") {
        text = `Counter-battens ${b.counterBattenNominal ?? b.nominal} up the slope at ${cbSpacing} in on centre, then battens ${b.nominal} across at ${b.spacingIn} in on centre.`;
        notes.push(`Counter-batten spacing ${cbSpacing} in on centre; over rafters where the deck allows.`);
      } else {
        text = `Battens ${b.nominal} across the slope at ${b.spacingIn} in on centre.`;
      }
      notes.push(`BATTEN SPACING ${b.spacingIn} IN ON CENTRE: clips land on battens only, so clip spacing is a whole multiple of it.`);
      notes.push(`Batten fasteners every ${rules.battens.fastenerSpacingIn} in.${b.treated ? " Treated lumber: use fasteners rated for it and keep it from touching the metal directly." : ""}`);
      notes.push(`Gap under the panels: ${inch(gap)} (dressed lumber sizes).`);
    } else {
      text = `${choice === "mesh" ? "3D mesh mat" : "Dimpled spacer sheet"} over the whole roof, ${inch(gap)} thick.`;
      notes.push("Butt the edges; do not lap the mat. Keep it flat under the clip lines.");
    }
    if (stack.ventilation.eaveOpen && stack.ventilation.topOpen) {
      notes.push("VENT OPENINGS: leave the gap open at the eave (vented closure with insect screen) and at the ridge (vented ridge closure); both ends open or no air moves.");
    }
    if (ch && !ch.qualifies && ch.reasons.length) notes.push(`The gap does not count as ventilation: ${ch.reasons.map((r) => r.replace(/\.+$/, "")).join("; ")}.`);
    steps.push({ title: choice === "counter-battens" ? "Counter-battens and battens" : choice === "battens" ? "Battens" : "Spacer mat", text, notes });
  }
  if (foil && stack.radiantBarrier.position === "under-panels") steps.push(foilStep());

  const p = stack.panel;
  const z = planes[0]?.windZones.clipSpacingIn;
  const longest = planes.reduce((m, pl) => Math.max(m, pl.panels.longestIn), 0);
  steps.push({
    title: "Panels",
    text: `${p.system === "standing-seam" ? "Standing-seam" : "Exposed-fastener"} panels, ${inch(p.coverageWidthIn)} coverage, ${p.gauge} gauge; start from the ${p.start === "centred" ? "centre line" : `${p.start} (seen from the eave)`}.`,
    notes: [
      ...(p.system === "standing-seam" && z ? [`Clip spacing: field ${inch(z.field)}, edge zone ${inch(z.edge)}, corner zone ${inch(z.corner)} (see the zone diagrams).`] : []),
      ...(p.system === "exposed-fastener" ? ["Screw pattern per the panel maker's schedule; closer in the edge and corner zones (see the zone diagrams)."] : []),
      `Longest panel ${formatInchesAsFeet(longest)}: carry long panels with enough hands; do not let them buckle.`,
      "Cut edges are sharp: gloves and sleeves when handling panels and trim.",
    ],
  });
  const types = new Set(planes.flatMap((pl) => pl.edges.map((e) => e.type)));
  const trim = ["eave", "rake", "ridge", "hip", "valley", "sidewall", "headwall", "transition"].filter((x) => types.has(x as never));
  if (trim.length) {
    steps.push({
      title: "Trim and flashing",
      text: `Trim on this area: ${trim.join(", ")} (see the trim list).`,
      notes: ["Follow the panel maker's tested trim details for the order of trim, underlayment and closures."],
    });
  }
  return steps;
}

function zoneRows(wz: PlaneResult["windZones"], system: "standing-seam" | "exposed-fastener", screwsPerClip: number): ZoneFastenerRow[] {
  return (WIND_ZONES as readonly WindZone[])
    .map((z) => {
      const c = wz.zones[z];
      return {
        zone: z,
        spacingIn: system === "standing-seam" ? wz.clipSpacingIn[zoneKey(z)] : null,
        clips: c.clips,
        screws: system === "standing-seam" ? c.clips * screwsPerClip : Math.ceil(c.panelScrews - 1e-9),
        lineFt: c.lineFt,
      };
    })
    .filter((r) => r.clips > 0 || r.lineFt > 0);
}

export function buildInstallPacketDoc(input: InstallPacketInput): InstallPacketDocDto {
  const { job, roof, takeoff: t } = input;
  const rules = rulesSchema.parse(input.rules ?? {});
  const site = siteSchema.parse(job.site ?? {});
  const stacks = new Map<string, StackInput>(roof.stacks.map((raw) => {
    const s = stackSchema.parse(raw);
    return [s.id, s];
  }));
  const stackIds = [...stacks.keys()];
  const stackTitle = (id: string) => clean(stacks.get(id)?.name) || `Area ${stackIds.indexOf(id) + 1}`;
  const number = new Map(roof.planes.map((p, i) => [p.id, i + 1]));
  const inputPlane = new Map(roof.planes.map((p) => [p.id, p]));

  const areas: InstallArea[] = t.stacks
    .filter((s) => s.planeIds.length > 0 && stacks.has(s.id))
    .map((s) => {
      const planes = t.planes.filter((p) => p.stackId === s.id);
      return {
        stackId: s.id,
        title: t.stacks.length === 1 ? "Whole roof" : stackTitle(s.id),
        planeNumbers: planes.map((p) => number.get(p.id) ?? 0),
        planeNames: planes.map((p) => p.name || `Plane ${number.get(p.id)}`),
        squares: s.squares,
        steps: installSteps(stacks.get(s.id)!, planes, t, rules),
      };
    });

  const planes: InstallPlane[] = t.planes.map((p) => {
    const ip = inputPlane.get(p.id);
    const pieces = p.edges.map((e) => ({ type: e.type, from: e.from, to: e.to })) as unknown as EdgePiece[];
    const roofEdges = planeRoofEdges(pieces);
    const w = p.windZones.widths;
    return {
      id: p.id,
      number: number.get(p.id) ?? 0,
      name: p.name || `Plane ${number.get(p.id)}`,
      pitch: p.pitch,
      outline: ip?.outline ?? p.vertices.map((v) => [v.x, v.y] as [number, number]),
      eaveEdge: p.eaveEdge,
      stackTitle: stackTitle(p.stackId),
      squares: p.squares,
      slopedAreaSqFt: p.slopedAreaSqFt,
      system: p.panels.system,
      coverageWidthIn: p.panels.coverageWidthIn,
      panelCount: p.panels.count,
      longestIn: p.panels.longestIn,
      cutList: p.panels.cutList.map((c) => ({ lengthIn: c.lengthIn, count: c.count })),
      fasteners: zoneRows(p.windZones, p.panels.system, rules.clips.screwsPerClip),
      zoneDiagram: {
        model: p.windZones.model,
        roofEdges: roofEdges.edges.map((e) => ({ from: [e.a[0], e.a[1]] as [number, number], to: [e.b[0], e.b[1]] as [number, number] })),
        corners: roofEdges.corners,
        zone2PlanFt: w.zone2PlanFt,
        zone3PlanFt: w.zone3PlanFt,
        zone1PlanFt: w.zone1PlanFt ?? null,
        zone3AsZone2: p.windZones.zone3AsZone2,
      },
      spacingLimitedByBattens: p.windZones.spacingLimitedByBattens,
    };
  });

  const system = t.planes[0]?.panels.system ?? "standing-seam";
  const fastenerTotals: ZoneFastenerRow[] = (WIND_ZONES as readonly WindZone[])
    .map((z) => {
      const f = t.fasteners.zones[z];
      return {
        zone: z,
        spacingIn: null,
        clips: f.clips,
        screws: system === "standing-seam" ? f.clipScrews : Math.ceil(f.panelScrews - 1e-9),
        lineFt: f.lineFt,
      };
    })
    .filter((r) => r.clips > 0 || r.lineFt > 0);

  const trimCats = new Set(["trim", "flashing", "closures"]);
  const material = (m: TakeoffResult["materials"][number]) => ({ description: m.description, quantity: m.quantity, unit: m.unit, basis: m.basis });
  const preparation: string[] = [];
  if (site.tearOff && site.existingLayers > 0) preparation.push(`Tear off ${site.existingLayers} existing ${site.existingLayers === 1 ? "layer" : "layers"} down to the deck; tarp landscaping and windows; magnet-sweep the site daily.`);
  preparation.push("Leave the roof watertight at the end of each day.");
  const maxPitch = t.planes.reduce((m, p) => Math.max(m, p.pitch), 0);
  if (maxPitch > 6) preparation.push(`Steep planes up to ${formatPitch(maxPitch)}: set anchors and fall protection before work starts on them.`);

  return {
    company: { name: clean(input.company.name), phone: clean(input.company.phone) || null, licenceNumber: clean(input.company.licenceNumber) || null },
    reference: input.reference ?? `Job ${job.id}`,
    optionLabel: input.optionLabel ?? null,
    date: input.date.slice(0, 10),
    customerName: clean(job.customerName),
    customerPhone: clean(job.customerPhone) || null,
    siteAddressLines: addressLines({ line1: job.siteAddressLine1, line2: job.siteAddressLine2, city: job.siteCity, region: job.siteRegion, postalCode: job.sitePostalCode }),
    crew: (job.crew ?? []).map((c) => c.name),
    preparation,
    areas,
    planes,
    fastenerTotals,
    windNote: `Edge distance a = ${formatFeetInches(t.wind.aFt)} (${t.wind.governs} governs${t.wind.leastHorizontalDimensionEstimated ? ", least dimension estimated" : ""}). Zones follow the ASCE 7 components-and-cladding figures as simplified by the takeoff: zone 3 within a of two roof edges meeting at a corner, zone 2 within a of one edge, zone 1 elsewhere. The panel maker's uplift schedule and a design professional govern.`,
    trim: t.materials.filter((m) => trimCats.has(m.category)).map(material),
    otherMaterials: t.materials.filter((m) => !trimCats.has(m.category) && m.category !== "panels").map(material),
    photoSlots: (input.photos ?? []).map((p) => ({ caption: p.caption, attachmentId: p.attachmentId ?? null })),
    advisories: t.advisories.filter((a) => a.severity !== "info").map((a) => ({ severity: a.severity, message: a.message, reference: a.reference })),
    cautions: crewSafetyCautions(maxPitch),
  };
}

/**
 * The cautions as the crew needs them (the proposal's are written to the homeowner). Fall protection:
 * OSHA 29 CFR 1926.501(b)(13) for residential construction at 6 ft or more, 1926.501(b)(11) on steep roofs
 * (over 4 in 12, 1926.500(b)).
 */
export function crewSafetyCautions(maxPitch: number): InstallPacketDocDto["cautions"] {
  const steep = maxPitch > 4;
  return {
    items: [
      {
        title: "Falls",
        text: `${steep ? `Steep roof: up to ${Number(maxPitch.toFixed(1))}/12. ` : ""}Fall protection at 6 ft or more above a lower level, at any slope: guardrails, safety nets or personal fall arrest${steep ? " (on a roof over 4/12: guardrails with toeboards, nets or personal fall arrest)" : ""}, set up before anyone goes up. Keep the ground below the eaves clear.`,
      },
      {
        title: "Power lines",
        text: "Look up before raising ladders or carrying panels: keep ladders, panels and tools well clear of overhead lines, and stop work and call the office if a line is close to the roof.",
      },
      {
        title: "Hot metal",
        text: "Panels in the sun burn skin: gloves and long sleeves, water and shade breaks; work the sunny slopes early where you can.",
      },
      {
        title: "Sharp edges",
        text: "Cut edges, offcuts and screws are sharp: cut-resistant gloves and eye protection; collect offcuts and screws as you go.",
      },
    ],
    governs:
      "The panel maker's tested installation details and local codes govern over this packet. Where they ask for more (closer clips, other fasteners, extra underlayment), do what they ask and tell the office.",
  };
}
