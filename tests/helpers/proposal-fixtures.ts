/**
 * Invented proposal data around real engine takeoffs: a generated roof, option specs applied to its
 * stacks, computeTakeoff per option. No real people or companies; e-mails at example.com.
 */
import { computeTakeoff } from "@shared/engine/takeoff";
import { hipRoof, lShapeGableRoof } from "@shared/engine/roof/generators";
import { buildBenchRoof } from "@shared/engine/roof/bench-roof";
import type { TakeoffResult } from "@shared/engine/types";
import { stackSchema } from "@shared/schemas/takeoff";
import { applyOptionSpec, type OptionSpec, type ProposalContentInput } from "@server/services/proposal-content";

export const DEMO_COMPANY = {
  name: "Quarry Slope Steelworks",
  legalName: "Quarry Slope Steelworks LLC",
  licenceNumber: "RC-204518",
  addressLine1: "118 Tinplate Road",
  city: "Harrow Falls",
  region: "OR",
  postalCode: "97099",
  phone: "(555) 013-2288",
  email: "office@quarryslope.example.com",
  website: "https://quarryslope.example.com",
};

export const LONG_COMPANY_NAME =
  "Northern Ridge & Valley Standing-Seam Metal Roofing, Re-Roofing, Gutter and Sheet-Metal Fabrication Cooperative of the Upper Harrow Watershed";

export interface FixtureRoof {
  site: Record<string, unknown>;
  planes: { id: string; name: string; pitch: number; outline: [number, number][]; eaveEdge: number; stackId?: string }[];
  stacks: Record<string, unknown>[];
  defaultStackId: string;
}

/** A house: an L-shaped gable main roof (battens over counter-battens with foil) and a hip porch roof on mesh. */
export function demoRoof(): FixtureRoof {
  const main = lShapeGableRoof({ mainWidthFt: 44, mainDepthFt: 28, wingWidthFt: 20, wingDepthFt: 14, wingOffsetFt: 12 }, 8, { idPrefix: "m", stackId: "upper" });
  const porch = hipRoof(16, 9, 3, { idPrefix: "porch", origin: [35, -11], stackId: "porch" });
  return {
    site: {
      atticType: "vented",
      climateZone: "4C",
      iceDamRisk: true,
      existingLayers: 2,
      tearOff: true,
      wind: { basicWindSpeedMph: 110, exposure: "B", meanRoofHeightFt: 18, leastHorizontalDimensionFt: 28 },
    },
    planes: [...main, ...porch].map((p) => ({ ...p, name: p.name.startsWith("porch") ? `Porch ${p.name}` : p.name })),
    stacks: [
      {
        id: "upper",
        name: "Main roof",
        deck: { action: "repair", repairSharePct: 10 },
        underlayment: { kind: "synthetic", highTemp: true },
        spacer: { kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: true, treated: true } },
        radiantBarrier: { kind: "foil", position: "on-deck", reflectiveFace: "up" },
        panel: { system: "standing-seam", coverageWidthIn: 16, gauge: 24, solarReflectance: 0.34, thermalEmittance: 0.85 },
      },
      {
        id: "porch",
        name: "Porch roof",
        underlayment: { kind: "self-adhered", highTemp: true },
        spacer: { kind: "mesh" },
        panel: { system: "standing-seam", coverageWidthIn: 16, gauge: 24, solarReflectance: 0.34 },
      },
    ],
    defaultStackId: "upper",
  };
}

/** The bench roof generator's roof cut to n planes (40 planes spread over several buildings). */
export function manyPlaneRoof(n: number): FixtureRoof {
  const r = buildBenchRoof(n) as unknown as FixtureRoof;
  r.planes = r.planes.map((p, i) => ({ ...p, name: `${["Front", "Back", "Side", "Wing", "Dormer"][i % 5]} slope ${i + 1}` }));
  return r;
}

/** Computes a takeoff with the option's spec applied to every stack. */
export function takeoffFor(roof: FixtureRoof, spec: OptionSpec = {}): TakeoffResult {
  const stacks = roof.stacks.map((s) => applyOptionSpec(stackSchema.parse(s), spec));
  const planes = spec.stackId ? roof.planes.map((p) => ({ ...p, stackId: spec.stackId })) : roof.planes;
  const out = computeTakeoff({ site: roof.site, planes, stacks, defaultStackId: roof.defaultStackId });
  if (!out.ok) throw new Error(`takeoff refused: ${out.reason} at ${out.path.join(".")}`);
  return out.result;
}

export const DEMO_OPTIONS: { label: string; spec: OptionSpec; totalCents: number }[] = [
  { label: "As designed: battens and foil", spec: {}, totalCents: 4_186_450 },
  { label: "Mesh mat with foil", spec: { spacer: "mesh", foil: true }, totalCents: 3_912_075 },
  { label: "No spacer, no foil", spec: { spacer: "none", foil: false }, totalCents: 3_455_010 },
  { label: "Dimpled sheet", spec: { spacer: "dimpled" }, totalCents: 3_701_990 },
  { label: "Battens only (no counter-battens), no foil", spec: { spacer: "battens", foil: false }, totalCents: 3_640_500 },
];

const TAX_RATE = 0.0725;

/** Invented totals: the price before tax and the tax add up to the total; deposit 30 % to the dollar. */
export function totalsFor(totalCents: number, depositPct = 30) {
  const priceCents = Math.round(totalCents / (1 + TAX_RATE));
  return { priceCents, taxCents: totalCents - priceCents, totalCents, depositCents: Math.round((totalCents * depositPct) / 100 / 100) * 100 };
}

export function proposalInput(over: {
  roof?: FixtureRoof;
  optionCount?: number;
  companyName?: string;
  customerName?: string;
  acceptance?: ProposalContentInput["acceptance"];
  status?: ProposalContentInput["quote"]["status"];
} = {}): ProposalContentInput {
  const roof = over.roof ?? demoRoof();
  const options = DEMO_OPTIONS.slice(0, over.optionCount ?? 3).map((o, i) => ({
    id: String(101 + i),
    label: o.label,
    spec: o.spec,
    takeoff: takeoffFor(roof, o.spec),
    totals: totalsFor(o.totalCents),
  }));
  return {
    company: { ...DEMO_COMPANY, name: over.companyName ?? DEMO_COMPANY.name },
    customer: {
      name: over.customerName ?? "Marisol Vantongeren",
      email: "homeowner@example.com",
      phone: "(555) 014-7730",
      addressLine1: "42 Larkspur Bend",
      city: "Harrow Falls",
      region: "OR",
      postalCode: "97099",
    },
    job: {
      id: 7,
      siteAddressLine1: "42 Larkspur Bend",
      siteCity: "Harrow Falls",
      siteRegion: "OR",
      sitePostalCode: "97099",
      site: roof.site,
    },
    quote: { number: "QSS-1042", revisionNo: 2, status: over.status ?? "sent" },
    roof: { planes: roof.planes, stacks: roof.stacks, defaultStackId: roof.defaultStackId },
    options,
    settings: { depositPct: 30, proposalValidityDays: 30 },
    issuedAt: "2026-03-05T15:30:00.000Z",
    acceptUrl: "https://app.example.com/p/Xb3kQ9vT2mW7rY4pL8sN1cF6hJ0dG5aZ-eU_iO3tK",
    acceptance: over.acceptance ?? null,
  };
}
