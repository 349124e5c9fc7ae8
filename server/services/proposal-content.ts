/**
 * Turns a quote revision's frozen data (job, customer, company profile, roof snapshot, each option's
 * takeoff and totals) into the ProposalDocDto that the PDF and the homeowner's page render.
 * Pure: no I/O, no clock (the issue date comes in), so a frozen revision always gives the same document.
 * Inputs are plain objects (the shapes of the quotes API and shared/schemas), not models.
 */
import { siteSchema, stackSchema, type SiteInput, type StackInput } from "../../shared/schemas/takeoff";
import {
  formatMoney,
  formatDate,
  formatPercent,
  type ProposalDocDto,
  type ProposalOption,
  type ScopeArea,
  type ScopeLayer,
  PROPOSAL_STATUSES,
} from "../../shared/schemas/proposal";
import type { StackResult, TakeoffResult } from "../../shared/engine/types";
import { applySpacerAndFoil } from "../../shared/engine/stack-options";

// ---------------------------------------------------------------------------------------------------
// input shapes
// ---------------------------------------------------------------------------------------------------

export interface ContentCompanyInput {
  name: string;
  legalName?: string | null;
  licenceNumber?: string | null;
  addressLine1?: string | null;
  addressLine2?: string | null;
  city?: string | null;
  region?: string | null;
  postalCode?: string | null;
  phone?: string | null;
  email?: string | null;
  website?: string | null;
  proposalTerms?: string | null;
  exclusions?: string | null;
  warranty?: string | null;
  logoDataUrl?: string | null;
}

export interface ContentCustomerInput {
  name: string;
  email?: string | null;
  phone?: string | null;
  addressLine1?: string | null;
  addressLine2?: string | null;
  city?: string | null;
  region?: string | null;
  postalCode?: string | null;
}

export interface ContentJobInput {
  id: number;
  siteAddressLine1?: string | null;
  siteAddressLine2?: string | null;
  siteCity?: string | null;
  siteRegion?: string | null;
  sitePostalCode?: string | null;
  /** The job's site (or the revision's site_snapshot); raw input, defaults filled here. */
  site?: unknown;
}

/** A quote option's spec (quote_options.spec): applied to every plane's stack. */
export interface OptionSpec {
  spacer?: "none" | "battens" | "counter-battens" | "mesh" | "dimpled";
  foil?: boolean;
  stackId?: string;
}

export interface ContentOptionInput {
  id: string | number;
  label: string;
  spec?: OptionSpec | null;
  /** The engine result stored with the option. */
  takeoff: TakeoffResult;
  totals: { priceCents: number; taxCents: number; totalCents: number; depositCents: number };
}

export interface ContentRoofPlane {
  id: string;
  name?: string;
  pitch: number;
  outline: [number, number][];
  eaveEdge: number;
  stackId?: string;
}

export interface ContentRoofInput {
  planes: ContentRoofPlane[];
  /** Stacks as stored (raw input; defaults filled here). */
  stacks: unknown[];
  defaultStackId: string;
}

export interface ProposalContentInput {
  company: ContentCompanyInput;
  customer: ContentCustomerInput;
  job: ContentJobInput;
  quote: { number: string; revisionNo: number; status: (typeof PROPOSAL_STATUSES)[number] };
  roof: ContentRoofInput;
  options: ContentOptionInput[];
  settings: { depositPct: number; proposalValidityDays: number };
  /** When the proposal is issued (ISO); the validity date counts from it. */
  issuedAt: string;
  /** Overrides issuedAt + proposalValidityDays (a proposal's stored expiry). */
  validUntil?: string | null;
  acceptUrl: string;
  acceptance?: { signerName: string; acceptedAt: string; optionId: string | number } | null;
}

// ---------------------------------------------------------------------------------------------------
// small helpers
// ---------------------------------------------------------------------------------------------------

const clean = (s: string | null | undefined) => (s ?? "").trim();

/** Street lines, then "City, Region Postal", empty parts left out. */
export function addressLines(a: { line1?: string | null; line2?: string | null; city?: string | null; region?: string | null; postalCode?: string | null }): string[] {
  const cityRegion = [clean(a.city), [clean(a.region), clean(a.postalCode)].filter(Boolean).join(" ")].filter(Boolean).join(", ");
  return [clean(a.line1), clean(a.line2), cityRegion].filter(Boolean);
}

/** Free text from the company profile → paragraphs (blank lines or "- " bullets split them). */
export function paragraphs(s: string | null | undefined): string[] {
  return clean(s)
    .split(/\r?\n/)
    .map((l) => l.replace(/^\s*[-•*]\s+/, "").trim())
    .filter(Boolean);
}

/** Inches in words, as fractions where the size is a common one: 0.625 → "5/8 inch", 1.5 → "1-1/2 inch". */
const inchWords = (x: number) => {
  const eighths = Math.round(x * 8);
  if (Math.abs(x * 8 - eighths) < 0.02 && eighths % 8 !== 0) {
    const whole = Math.floor(eighths / 8);
    let num = eighths % 8;
    let den = 8;
    while (num % 2 === 0) {
      num /= 2;
      den /= 2;
    }
    return whole ? `${whole}-${num}/${den} inch` : `${num}/${den} inch`;
  }
  return `${Number(x.toFixed(2))} inch`;
};
const inchesText = (x: number) => inchWords(x).replace(/ inch$/, x > 1 ? " inches" : " inch");

export function addDaysIso(iso: string, days: number): string {
  const d = new Date(iso);
  const base = Number.isNaN(d.getTime()) ? new Date(0) : d;
  return new Date(Date.UTC(base.getUTCFullYear(), base.getUTCMonth(), base.getUTCDate() + days)).toISOString().slice(0, 10);
}

// ---------------------------------------------------------------------------------------------------
// option specs
// ---------------------------------------------------------------------------------------------------

export type SpacerChoice = NonNullable<OptionSpec["spacer"]>;

/** The spacer as a homeowner-level choice: battens with counter-battens count as their own kind. */
export const spacerChoice = (s: StackInput): SpacerChoice =>
  s.spacer.kind === "battens" ? (s.spacer.battens.counterBattens ? "counter-battens" : "battens") : s.spacer.kind;

/**
 * A stack with an option's spec applied (spacer and foil; stackId is applied by the caller, since it
 * swaps the whole stack). Battens keep the stack's batten settings; mats keep their thickness.
 */
export function applyOptionSpec(stack: StackInput, spec: OptionSpec | null | undefined): StackInput {
  return applySpacerAndFoil(stack, spec ?? {});
}

const SPACER_PHRASE: Record<SpacerChoice, string> = {
  none: "no spacer (the panels lie on the underlayment, with no air gap)",
  battens: "wood battens across the slope",
  "counter-battens": "wood battens over counter-battens (an open air channel from eave to ridge)",
  mesh: "a 3D plastic mesh mat",
  dimpled: "a dimpled plastic spacer sheet",
};

// ---------------------------------------------------------------------------------------------------
// the scope writer
// ---------------------------------------------------------------------------------------------------

/** What the takeoff found about one stack that the words depend on. */
export interface StackFacts {
  /** Deck-to-panel gap and the air channel, inches. */
  gapIn: number;
  channelHeightIn: number;
  continuous: boolean;
  qualifies: boolean;
  blockedByBattens: boolean;
  /** Ice barrier width up the slope at the eaves, inches; null when none. */
  iceBarrierWidthIn: number | null;
  /** Edge types present on the stack's planes (for the trim sentence). */
  edgeTypes: string[];
  /** Clip spacing used in the field and at the corners, inches (standing seam). */
  clipSpacingIn: { field: number; corner: number } | null;
}

/** The facts of one stack from a takeoff (null when no plane uses it). */
export function stackFactsFromTakeoff(t: TakeoffResult, stackId: string): StackFacts | null {
  const sr: StackResult | undefined = t.stacks.find((s) => s.id === stackId);
  if (!sr) return null;
  const planes = t.planes.filter((p) => p.stackId === stackId);
  const ice = planes.map((p) => p.layers.iceBarrier?.widthIn ?? 0).reduce((m, x) => Math.max(m, x), 0);
  const edgeTypes = [...new Set(planes.flatMap((p) => p.edges.map((e) => e.type)))];
  const first = planes[0];
  return {
    gapIn: sr.channel.gapIn,
    channelHeightIn: sr.channel.channelHeightIn,
    continuous: sr.channel.continuous,
    qualifies: sr.channel.qualifies,
    blockedByBattens: sr.channel.blockedByBattens,
    iceBarrierWidthIn: ice > 0 ? ice : null,
    edgeTypes,
    clipSpacingIn: first ? { field: first.windZones.clipSpacingIn.field, corner: first.windZones.clipSpacingIn.corner } : null,
  };
}

const METAL_NAME: Record<StackInput["panel"]["substrate"], string> = {
  "metallic-coated-steel": "steel",
  aluminum: "aluminum",
  copper: "copper",
  zinc: "zinc",
};

/**
 * The layer stack from the deck up, in sentences a homeowner understands: what each layer is, why it is
 * there, why the air gap, and which way the foil faces.
 */
export function describeStack(stack: StackInput, facts: StackFacts): ScopeLayer[] {
  const layers: ScopeLayer[] = [];

  // 1. Deck
  const deckMat = stack.deck.material === "osb" ? "OSB" : "plywood";
  const deck: string[] = [];
  if (stack.deck.action === "replace") {
    deck.push(`We install a new roof deck of ${inchWords(stack.deck.thicknessIn)} ${deckMat} sheets, the solid wood surface everything else is fastened to.`);
  } else if (stack.deck.action === "repair") {
    deck.push(
      "We check the roof deck (the wood sheathing under your roofing), re-nail loose sheets and replace damaged ones.",
      `The price allows for replacing about ${formatPercent(stack.deck.repairSharePct)} of the deck; if more turns out to be damaged, we show you and agree the cost before going on.`,
    );
  } else {
    deck.push("We keep the existing roof deck (the wood sheathing under your roofing), check it and re-nail any loose sheets.");
    deck.push("If we find damaged wood, we show you and agree the cost before replacing it.");
  }
  layers.push({ title: "Roof deck", sentences: deck });

  // 2. Ice barrier
  if (facts.iceBarrierWidthIn) {
    layers.push({
      title: "Ice barrier",
      sentences: [
        `Along the eaves, a self-sealing rubberised membrane goes on first, about ${Math.ceil(facts.iceBarrierWidthIn / 12)} feet up the roof.`,
        "It seals around every nail and keeps out the water that backs up behind ice dams in winter.",
      ],
    });
  }

  // 3. Underlayment
  const u = stack.underlayment;
  const under: string[] = [];
  if (u.kind === "synthetic") under.push("A synthetic underlayment covers the whole deck: a tough woven sheet that sheds water and is the roof's second line of defence under the metal.");
  else if (u.kind === "self-adhered") under.push("A self-adhered membrane covers the whole deck: it bonds to the wood and seals around fasteners, a fully waterproof second layer under the metal.");
  else under.push(`No. ${u.feltNumber} roofing felt covers the whole deck as a water-shedding second layer under the metal.`);
  if (u.highTemp && u.kind !== "felt") under.push("It is rated for the high temperatures that build up under metal roofing.");
  if (u.layers > 1) under.push("It is laid in two overlapping layers for extra protection.");
  layers.push({ title: "Underlayment", sentences: under });

  const choice = spacerChoice(stack);
  const foil = stack.radiantBarrier.kind === "foil";
  const gapText = inchesText(facts.gapIn);

  // 4. Foil on the deck side (below the spacer)
  const foilLayer = (): ScopeLayer => {
    const s: string[] = [];
    if (stack.radiantBarrier.position === "on-deck") {
      s.push(`A reflective foil sheet lies over the underlayment with its shiny side facing up, toward the air gap under the panels.`);
    } else {
      s.push(`A reflective foil sheet is fastened under the panels with its shiny side facing down, toward the air gap below it.`);
    }
    if (facts.gapIn > 0) {
      s.push(
        "Why it faces the gap: metal panels in the sun radiate heat downward. A shiny face next to open air reflects most of that heat and gives off very little of its own, so less heat reaches the deck and the rooms below.",
        "Pressed against a solid layer the foil would simply pass the heat through by contact, which is why it always faces the air space.",
      );
    } else {
      s.push("Note: in this assembly the foil has no air gap to face, so it does little; an option with a spacer lets it work.");
    }
    return { title: "Reflective foil", sentences: s };
  };
  if (foil && stack.radiantBarrier.position === "on-deck") layers.push(foilLayer());

  // 5. Spacer and the air gap
  const b = stack.spacer.battens;
  const gap: string[] = [];
  if (choice === "none") {
    gap.push("No spacer: the panels are fastened directly over the underlayment, with no air gap between the metal and the deck.");
  } else {
    if (choice === "battens") {
      gap.push(
        `${b.treated ? "Treated wood" : "Wood"} battens (${b.nominal}) are fastened across the slope every ${b.spacingIn} inches, and the panels are fastened to them, about ${gapText} above the deck.`,
      );
    } else if (choice === "counter-battens") {
      const cbSpacing = b.counterBattenSpacingIn ?? 24;
      gap.push(
        `Counter-battens (${b.counterBattenNominal ?? b.nominal}) are fastened up the slope every ${cbSpacing} inches, then battens (${b.nominal}) across them every ${b.spacingIn} inches; the panels are fastened to the battens, about ${gapText} above the deck.`,
      );
    } else if (choice === "mesh") {
      gap.push(`A 3D plastic mesh mat about ${gapText} thick is rolled out over the whole roof, and the panels rest on it.`);
    } else {
      gap.push(`A dimpled plastic sheet about ${gapText} thick covers the whole roof, and the panels rest on its raised dimples.`);
    }
    gap.push("Why the air gap: the metal does not sit on the underlayment, so moisture that forms under the panels can dry out instead of being trapped against the deck.");
    if (facts.qualifies) {
      gap.push(
        "Because the gap runs unbroken from the eaves to the ridge, is at least 3/4 inch deep and is open at both ends, warm air rises through it and leaves at the top, carrying off the sun's heat before it reaches the deck.",
      );
    } else if (facts.blockedByBattens) {
      gap.push("Battens laid across the slope close the gap at every row, so air does not flow from the eaves to the ridge; the gap still separates the metal from the deck.");
    } else if (facts.channelHeightIn < 0.75) {
      gap.push("At under 3/4 inch the gap is too thin to count as roof ventilation, but it still lets moisture escape and keeps the metal off the deck.");
    } else if (!stack.ventilation.eaveOpen || !stack.ventilation.topOpen) {
      gap.push("The gap is closed at one end, so it is not counted as ventilation; it still separates the metal from the deck.");
    }
  }
  layers.push({ title: choice === "none" ? "Air gap" : "Spacer and air gap", sentences: gap });

  // 6. Foil under the panels (above the spacer)
  if (foil && stack.radiantBarrier.position === "under-panels") layers.push(foilLayer());

  // 7. Vent openings
  if (choice !== "none" && facts.qualifies && stack.ventilation.eaveOpen && stack.ventilation.topOpen) {
    layers.push({
      title: "Vent openings",
      sentences: ["At the eaves and at the ridge, the gap is left open behind vented closures with insect screen, so air enters low and leaves high while insects and wind-driven rain stay out."],
    });
  }

  // 8. Panels
  const p = stack.panel;
  const metal = METAL_NAME[p.substrate];
  const gauge = p.substrate === "metallic-coated-steel" ? `, ${p.gauge} gauge` : "";
  const panel: string[] = [];
  if (p.system === "standing-seam") {
    panel.push(
      `Standing-seam ${metal} panels, ${Number(p.coverageWidthIn.toFixed(2))} inches wide${gauge}, run in one piece from the eave toward the ridge wherever the length allows.`,
      "They lock together at raised seams and are held down by hidden clips, so no screws pass through the panels.",
    );
    if (facts.clipSpacingIn && facts.clipSpacingIn.corner < facts.clipSpacingIn.field) {
      panel.push(
        `Near the edges and corners, where wind pulls hardest, the clips are set closer together (every ${Number(facts.clipSpacingIn.corner.toFixed(1))} inches at the corners instead of every ${Number(facts.clipSpacingIn.field.toFixed(1))} inches).`,
      );
    } else {
      panel.push("Near the edges and corners, where wind pulls hardest, the clips are set closer together.");
    }
  } else {
    panel.push(
      `Ribbed ${metal} panels, ${Number(p.coverageWidthIn.toFixed(2))} inches wide${gauge}, are fastened through the panel with screws that carry sealing washers.`,
      "Near the edges and corners, where wind pulls hardest, the screws are set closer together.",
    );
  }
  panel.push(`The finish reflects about ${Math.round(p.solarReflectance * 100)}% of the sun's energy when new.`);
  layers.push({ title: "Metal panels", sentences: panel });

  // 9. Trim
  const has = (t: string) => facts.edgeTypes.includes(t);
  const trimParts = [has("eave") && "eaves", has("rake") && "rakes", has("ridge") && "ridges", has("hip") && "hips"].filter(Boolean) as string[];
  const trim: string[] = [];
  if (trimParts.length) trim.push(`Matching metal trim finishes the ${joinWords(trimParts)}, with foam closures that seal the panel ribs.`);
  if (has("valley")) trim.push("Valleys get a metal valley pan over a strip of self-sealing membrane.");
  if (has("sidewall") || has("headwall")) trim.push("Where the roof meets a wall, new metal flashing is tucked under the siding and over the panels.");
  if (trim.length) layers.push({ title: "Trim and flashing", sentences: trim });
  return layers;
}

const joinWords = (w: string[]) => (w.length <= 1 ? w.join("") : `${w.slice(0, -1).join(", ")} and ${w[w.length - 1]}`);

// ---------------------------------------------------------------------------------------------------
// options
// ---------------------------------------------------------------------------------------------------

interface EffectiveStacks {
  /** Stack id → the stack as this option builds it. */
  byId: Map<string, StackInput>;
  /** Plane id → stack id under this option. */
  planeStack: Map<string, string>;
}

function effectiveStacks(roof: ContentRoofInput, stacks: Map<string, StackInput>, spec: OptionSpec | null | undefined): EffectiveStacks {
  const byId = new Map<string, StackInput>();
  for (const [id, s] of stacks) byId.set(id, applyOptionSpec(s, spec));
  const planeStack = new Map<string, string>();
  const forced = spec?.stackId && stacks.has(spec.stackId) ? spec.stackId : null;
  for (const p of roof.planes) planeStack.set(p.id, forced ?? p.stackId ?? roof.defaultStackId);
  return { byId, planeStack };
}

/** Plain-language differences of an option from the first (the first describes itself). */
export function describeOptionDifferences(
  first: { label: string; stacks: EffectiveStacks; takeoff: TakeoffResult; totalCents: number },
  option: { label: string; stacks: EffectiveStacks; takeoff: TakeoffResult; totalCents: number },
  stackTitle: (id: string) => string,
): string[] {
  const out: string[] = [];
  const pairs = new Map<string, { a: StackInput; b: StackInput; title: string }>();
  for (const [planeId, aId] of first.stacks.planeStack) {
    const bId = option.stacks.planeStack.get(planeId) ?? aId;
    const key = `${aId}→${bId}`;
    if (!pairs.has(key)) pairs.set(key, { a: first.stacks.byId.get(aId)!, b: option.stacks.byId.get(bId)!, title: stackTitle(aId) });
  }
  const multi = pairs.size > 1;
  for (const { a, b, title } of pairs.values()) {
    const where = multi ? `${title}: ` : "";
    const sa = spacerChoice(a);
    const sb = spacerChoice(b);
    if (sa !== sb) out.push(`${where}${cap(SPACER_PHRASE[sb])} instead of ${SPACER_PHRASE[sa]}.`);
    const fa = a.radiantBarrier.kind === "foil";
    const fb = b.radiantBarrier.kind === "foil";
    if (!fa && fb) out.push(`${where}Adds a reflective foil layer, shiny side toward the air gap.`);
    if (fa && !fb) out.push(`${where}Leaves out the reflective foil layer.`);
    if (a.underlayment.kind !== b.underlayment.kind) out.push(`${where}${cap(b.underlayment.kind)} underlayment instead of ${a.underlayment.kind}.`);
    if (a.panel.system !== b.panel.system) out.push(`${where}${b.panel.system === "standing-seam" ? "Standing-seam panels with hidden clips" : "Exposed-fastener ribbed panels"} instead of ${a.panel.system === "standing-seam" ? "standing-seam panels" : "exposed-fastener panels"}.`);
  }
  const ventA = first.takeoff.stacks.some((s) => s.channel.qualifies);
  const ventB = option.takeoff.stacks.some((s) => s.channel.qualifies);
  if (ventB && !ventA) out.push("The air gap runs open from the eaves to the ridge, so it carries heat away.");
  if (ventA && !ventB) out.push("The air gap does not carry air from the eaves to the ridge.");
  if (out.length === 0) out.push(`Same roof assembly as ${first.label}.`);
  const diff = option.totalCents - first.totalCents;
  if (diff !== 0) out.push(`${diff > 0 ? "+" : "-"}${formatMoney(Math.abs(diff))} compared with ${first.label}.`);
  return out;
}

function describeFirstOption(stacks: EffectiveStacks, stackTitle: (id: string) => string): string[] {
  const used = [...new Set(stacks.planeStack.values())];
  const out = ["The roof as described in the scope of work."];
  for (const id of used) {
    const s = stacks.byId.get(id)!;
    const where = used.length > 1 ? `${stackTitle(id)}: ` : "";
    const foil = s.radiantBarrier.kind === "foil" ? ", with reflective foil" : "";
    out.push(`${where}${cap(SPACER_PHRASE[spacerChoice(s)])}${foil}.`);
  }
  return out;
}

const cap = (s: string) => (s ? s[0].toUpperCase() + s.slice(1) : s);

// ---------------------------------------------------------------------------------------------------
// fixed texts
// ---------------------------------------------------------------------------------------------------

/** The safety and code cautions (proposal and install packet). */
export function safetyCautions(maxPitch: number): ProposalDocDto["cautions"] {
  const steep = maxPitch > 6;
  return {
    items: [
      {
        title: "Falls",
        text: `${steep ? `Parts of this roof are steep (up to ${Number(maxPitch.toFixed(1))}/12). ` : ""}Our crews work with fall protection (anchors, harnesses, guardrails or other systems as the slope and the law require). Please keep everyone off the roof and away from the eaves below the work.`,
      },
      {
        title: "Power lines",
        text: "Overhead power and service lines near the roof are dangerous to ladders and long metal panels. Tell us about any line near the house; we keep a safe distance and, where needed, ask the utility to cover or disconnect it.",
      },
      {
        title: "Hot metal",
        text: "Metal panels in the sun get hot enough to burn skin. Do not touch or walk on the panels; children and pets should stay clear.",
      },
      {
        title: "Sharp edges",
        text: "Cut panel edges, offcuts and screws are sharp. Keep children and pets away from the work area and the scrap bin until we have cleaned up.",
      },
    ],
    governs:
      "Local building codes, the panel maker's tested installation details and licensed professionals govern. Where they require more than this document describes, they prevail, and we agree any change in price with you before doing the work.",
  };
}

const DEFAULT_EXCLUSIONS = [
  "Repairs to rafters, fascia, soffits or other framing found damaged once the old roofing is off (shown to you and priced before the work goes on).",
  "Deck replacement beyond the allowance described in the scope of work.",
  "Gutters and downspouts, solar panels, satellite dishes and antennas, unless listed in the scope.",
  "Interior repairs, painting, insulation and attic work.",
  "Electrical work, and moving or covering overhead lines (arranged with the utility).",
  "Testing for or removing asbestos or other hazardous materials.",
];

const DEFAULT_WARRANTY = [
  "Workmanship: for 10 years from completion we repair, at no charge, leaks caused by our installation.",
  "Materials: the panel and finish maker's own warranties pass to you; we register them in your name and give you the documents at completion.",
  "Not covered: damage from storms beyond the roof's rated wind speed, falling trees or debris, foot traffic, and work on the roof by others.",
];

// ---------------------------------------------------------------------------------------------------
// the document
// ---------------------------------------------------------------------------------------------------

export function buildProposalDoc(input: ProposalContentInput): ProposalDocDto {
  if (input.options.length === 0) throw new RangeError("A proposal needs at least one option");
  const { company, customer, job, roof } = input;
  const site: SiteInput = siteSchema.parse(job.site ?? {});
  const stacks = new Map<string, StackInput>(roof.stacks.map((raw) => {
    const s = stackSchema.parse(raw);
    return [s.id, s];
  }));
  const stackIndex = [...stacks.keys()];
  const stackTitle = (id: string) => {
    const s = stacks.get(id);
    return clean(s?.name) || `Area ${stackIndex.indexOf(id) + 1}`;
  };
  const planeNumber = new Map(roof.planes.map((p, i) => [p.id, i + 1]));
  const planeName = (p: ContentRoofPlane) => clean(p.name) || `Plane ${planeNumber.get(p.id)}`;

  const opts = input.options.map((o) => ({ ...o, stacks: effectiveStacks(roof, stacks, o.spec) }));
  const first = opts[0];
  const t0 = first.takeoff;
  const planeResult = new Map(t0.planes.map((p) => [p.id, p]));

  // Scope: one area per stack in use under the first option.
  const used: string[] = [];
  for (const p of roof.planes) {
    const sid = first.stacks.planeStack.get(p.id)!;
    if (!used.includes(sid)) used.push(sid);
  }
  const areas: ScopeArea[] = used.map((sid) => {
    const planes = roof.planes
      .filter((p) => first.stacks.planeStack.get(p.id) === sid)
      .map((p) => ({ id: p.id, number: planeNumber.get(p.id)!, name: planeName(p), pitch: p.pitch, squares: planeResult.get(p.id)?.squares ?? 0 }));
    const facts = stackFactsFromTakeoff(t0, sid) ?? {
      gapIn: 0,
      channelHeightIn: 0,
      continuous: false,
      qualifies: false,
      blockedByBattens: false,
      iceBarrierWidthIn: null,
      edgeTypes: [],
      clipSpacingIn: null,
    };
    return {
      stackId: sid,
      title: used.length === 1 ? "Whole roof" : stackTitle(sid),
      planes,
      squares: planes.reduce((s, p) => s + p.squares, 0),
      layers: describeStack(first.stacks.byId.get(sid)!, facts),
    };
  });

  const preparation: string[] = [];
  if (site.tearOff && site.existingLayers > 0) {
    preparation.push(
      `We remove the existing roofing (${site.existingLayers} ${site.existingLayers === 1 ? "layer" : "layers"}) down to the deck, protect your plants, walls and windows, and haul the debris away.`,
    );
  } else {
    preparation.push("The new roof goes over a prepared surface without a tear-off, where local code allows it.");
  }
  const pipes = t0.materials.filter((m) => m.key.startsWith("pipe-boot")).reduce((s, m) => s + m.quantity, 0);
  if (pipes > 0) preparation.push(`Every pipe through the roof (${pipes}) gets a new flexible pipe boot sealed to the panels.`);
  if (t0.materials.some((m) => m.key === "flashing-chimney")) preparation.push("The chimney gets new metal flashing on all sides.");
  preparation.push("At the end of each day the roof is left watertight, and at the end of the job we sweep the site for nails and metal scraps with a magnet.");

  const totalSquares = t0.totals.squares;
  const firstLabel = first.label;
  const options: ProposalOption[] = opts.map((o, i) => ({
    id: String(o.id),
    label: o.label,
    differences:
      i === 0
        ? describeFirstOption(o.stacks, stackTitle)
        : describeOptionDifferences(
            { label: firstLabel, stacks: first.stacks, takeoff: first.takeoff, totalCents: first.totals.totalCents },
            { label: o.label, stacks: o.stacks, takeoff: o.takeoff, totalCents: o.totals.totalCents },
            stackTitle,
          ),
    priceCents: o.totals.priceCents,
    taxCents: o.totals.taxCents,
    totalCents: o.totals.totalCents,
    depositCents: o.totals.depositCents,
  }));

  const date = input.issuedAt.slice(0, 10);
  const validUntil = input.validUntil ? input.validUntil.slice(0, 10) : addDaysIso(input.issuedAt, input.settings.proposalValidityDays);
  const depositPct = input.settings.depositPct;
  const paymentTerms = [
    `A deposit of ${formatPercent(depositPct)} of the total of the option you choose is due when you accept; it reserves your place in our schedule and orders your materials.`,
    ...(paragraphs(company.proposalTerms).length
      ? paragraphs(company.proposalTerms)
      : [
          "The balance is due on completion, after we walk the finished roof with you.",
          "You can pay the deposit by card through the secure link below; the balance by card, bank transfer or check.",
        ]),
    `Prices hold until ${formatDate(validUntil)}. After that date we may need to update material prices before starting.`,
  ];

  const siteLines = addressLines({ line1: job.siteAddressLine1, line2: job.siteAddressLine2, city: job.siteCity, region: job.siteRegion, postalCode: job.sitePostalCode });
  const maxPitch = roof.planes.reduce((m, p) => Math.max(m, p.pitch), 0);
  const acceptedOption = input.acceptance ? options.find((o) => o.id === String(input.acceptance!.optionId)) : undefined;

  return {
    company: {
      name: clean(company.name),
      legalName: clean(company.legalName) || null,
      licenceNumber: clean(company.licenceNumber) || null,
      addressLines: addressLines({ line1: company.addressLine1, line2: company.addressLine2, city: company.city, region: company.region, postalCode: company.postalCode }),
      phone: clean(company.phone) || null,
      email: clean(company.email) || null,
      website: clean(company.website) || null,
      logoDataUrl: company.logoDataUrl ?? null,
    },
    proposalNumber: input.quote.number,
    revisionNo: input.quote.revisionNo,
    date,
    validUntil,
    homeowner: {
      name: clean(customer.name),
      email: clean(customer.email) || null,
      phone: clean(customer.phone) || null,
      addressLines: addressLines({ line1: customer.addressLine1, line2: customer.addressLine2, city: customer.city, region: customer.region, postalCode: customer.postalCode }),
    },
    siteAddressLines: siteLines,
    introduction: `Thank you for asking ${clean(company.name)} to look at your roof. This proposal describes the new metal roof we would install${siteLines[0] ? ` at ${siteLines[0]}` : ""}, what each layer does, and ${options.length === 1 ? "its price" : `the ${options.length} options we have priced for you`}. When you are ready, choose ${options.length === 1 ? "it" : "an option"} and accept online through the link at the end.`,
    scope: { preparation, areas, totalSquares },
    plan: {
      planes: roof.planes.map((p) => ({ id: p.id, number: planeNumber.get(p.id)!, name: planeName(p), pitch: p.pitch, outline: p.outline, eaveEdge: p.eaveEdge })),
    },
    options,
    depositPct,
    paymentTerms,
    exclusions: paragraphs(company.exclusions).length ? paragraphs(company.exclusions) : DEFAULT_EXCLUSIONS,
    warranty: paragraphs(company.warranty).length ? paragraphs(company.warranty) : DEFAULT_WARRANTY,
    cautions: safetyCautions(maxPitch),
    acceptUrl: input.acceptUrl,
    status: input.quote.status,
    acceptance:
      input.acceptance && acceptedOption
        ? { signerName: input.acceptance.signerName, acceptedAt: input.acceptance.acceptedAt, optionId: acceptedOption.id, optionLabel: acceptedOption.label }
        : null,
  };
}
