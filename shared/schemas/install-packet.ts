/**
 * The crew's install packet: what the PDF (server/pdf/install-packet-pdf.ts) and the printable page render.
 * Lengths are feet (plan or true, as named) and whole inches for panels; plan coordinates feet (x east,
 * y north). No prices: crews never see quote money.
 */
import { z } from "zod";
import { planPlaneSchema } from "./proposal";

const text = z.string();
const nullableText = z.string().nullable();

export const WIND_ZONE_IDS = ["1'", "1", "2", "3"] as const;

export const installStepSchema = z.object({
  /** "1. Tear-off", "Underlayment", … in install order. */
  title: text,
  /** What to do. */
  text,
  /** The notes that matter on site (foil face, batten spacing, vent openings, laps). */
  notes: z.array(text),
});
export type InstallStep = z.infer<typeof installStepSchema>;

export const installAreaSchema = z.object({
  stackId: text,
  title: text,
  planeNumbers: z.array(z.number().int()),
  planeNames: z.array(text),
  squares: z.number(),
  steps: z.array(installStepSchema),
});
export type InstallArea = z.infer<typeof installAreaSchema>;

export const zoneFastenerRowSchema = z.object({
  zone: z.enum(WIND_ZONE_IDS),
  /** Clip (or screw) spacing along the clip line in this zone, inches. */
  spacingIn: z.number().nullable(),
  clips: z.number().int(),
  /** Clip screws (clips × screws per clip) or exposed-fastener panel screws, rounded up. */
  screws: z.number().int(),
  /** Clip-line length in the zone, ft along the slope. */
  lineFt: z.number(),
});
export type ZoneFastenerRow = z.infer<typeof zoneFastenerRowSchema>;

/** What the zone diagram needs: the roof edges that make zones and the band widths, plan feet. */
export const zoneDiagramSchema = z.object({
  model: z.enum(["steep", "low-slope"]),
  /** Roof edges (eave, rake, ridge, hip) of the plane, in plan feet. */
  roofEdges: z.array(z.object({ from: z.tuple([z.number(), z.number()]), to: z.tuple([z.number(), z.number()]) })),
  /** Pairs of roof edges (indexes into roofEdges) that meet at a corner. */
  corners: z.array(z.tuple([z.number().int(), z.number().int()])),
  /** Zone 2 band width, plan ft (the edge distance a on steep roofs). */
  zone2PlanFt: z.number(),
  /** Zone 3 corner sizes, plan ft (equal on steep roofs). */
  zone3PlanFt: z.tuple([z.number(), z.number()]),
  /** Low-slope only: zone 1 band width (beyond it zone 1'). */
  zone1PlanFt: z.number().nullable(),
  zone3AsZone2: z.boolean(),
});
export type ZoneDiagram = z.infer<typeof zoneDiagramSchema>;

export const installPlaneSchema = planPlaneSchema.extend({
  stackTitle: text,
  squares: z.number(),
  slopedAreaSqFt: z.number(),
  system: z.enum(["standing-seam", "exposed-fastener"]),
  coverageWidthIn: z.number(),
  panelCount: z.number().int(),
  longestIn: z.number(),
  /** Equal lengths grouped, longest first. */
  cutList: z.array(z.object({ lengthIn: z.number(), count: z.number().int() })),
  fasteners: z.array(zoneFastenerRowSchema),
  zoneDiagram: zoneDiagramSchema,
  /** Zones whose clip spacing the battens made wider than asked (clips land on battens only). */
  spacingLimitedByBattens: z.array(text),
});
export type InstallPlane = z.infer<typeof installPlaneSchema>;

export const installMaterialSchema = z.object({ description: text, quantity: z.number(), unit: text, basis: text });

export const installPacketDocSchema = z.object({
  company: z.object({ name: text, phone: nullableText, licenceNumber: nullableText }),
  /** "Job 42" or the proposal number. */
  reference: text,
  /** The option being built, when the packet follows an accepted proposal. */
  optionLabel: nullableText,
  date: text,
  customerName: text,
  customerPhone: nullableText,
  siteAddressLines: z.array(text),
  crew: z.array(text),
  /** Tear-off and site notes, in order, before the areas. */
  preparation: z.array(text),
  areas: z.array(installAreaSchema),
  planes: z.array(installPlaneSchema),
  /** Roof-wide fastener totals by zone. */
  fastenerTotals: z.array(zoneFastenerRowSchema),
  windNote: text,
  trim: z.array(installMaterialSchema),
  otherMaterials: z.array(installMaterialSchema),
  photoSlots: z.array(z.object({ caption: text, attachmentId: z.number().int().nullable() })),
  advisories: z.array(z.object({ severity: z.enum(["error", "warning", "info"]), message: text, reference: text })),
  cautions: z.object({ items: z.array(z.object({ title: text, text })), governs: text }),
});
export type InstallPacketDocDto = z.infer<typeof installPacketDocSchema>;
