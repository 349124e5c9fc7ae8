import type { QuoteDetail, QuoteLineDto, QuoteOptionDto, RevisionDetail } from "@shared/schemas/quote";

export const line = (extra: Partial<QuoteLineDto> & Pick<QuoteLineDto, "id" | "kind" | "description">): QuoteLineDto => ({
  position: extra.id,
  key: null,
  quantity: 1,
  unit: "ea",
  unitCostCents: 0,
  costCents: 0,
  priceCents: 0,
  taxable: false,
  overrideReason: null,
  ...extra,
});

export const option = (extra: Partial<QuoteOptionDto> & Pick<QuoteOptionDto, "id" | "label">): QuoteOptionDto => ({
  position: extra.id,
  spec: {},
  totals: { costCents: 0, priceCents: 0, taxCents: 0, totalCents: 0, marginPct: 0, depositCents: 0 },
  belowMinMargin: false,
  hasOverrides: false,
  missingItems: [],
  unmatchedOverrides: [],
  takeoffSummary: { squares: 24.6, panelCount: 38, advisories: { error: 0, warning: 1, info: 2 } },
  lines: [],
  ...extra,
});

/** Two options: as designed (margin 31.2%) and with a mesh spacer and foil (margin 17.5%, below the 20% minimum). */
export function revision(extra: Partial<RevisionDetail> = {}): RevisionDetail {
  return {
    id: 501,
    revisionNo: 1,
    status: "draft",
    version: 4,
    notes: null,
    roofVersion: 7,
    createdBy: { id: 2, name: "Sam Example" },
    createdAt: "2025-03-01T14:00:00.000Z",
    updatedAt: "2025-03-01T14:00:00.000Z",
    submittedAt: null,
    submittedBy: null,
    approvedAt: null,
    approvedBy: null,
    approvalReason: null,
    returnedAt: null,
    returnedBy: null,
    returnComment: null,
    priceBookVersion: 12,
    minMarginPct: 20,
    needsApprovalReason: false,
    manualLines: [],
    overrides: [],
    discount: null,
    options: [
      option({
        id: 71,
        label: "As designed",
        totals: { costCents: 1_523_400, priceCents: 2_214_244, taxCents: 61_000, totalCents: 2_275_244, marginPct: 31.2, depositCents: 682_600 },
        lines: [
          line({ id: 1, kind: "material", key: "panel-standing-seam", description: "Standing-seam panel, 24 ga", quantity: 1240, unit: "lf", unitCostCents: 585, costCents: 725_400, priceCents: 1_054_360, taxable: true }),
          line({ id: 2, kind: "labor", key: "labor:4-8", description: "Install, 4/12 to under 8/12", quantity: 24.6, unit: "square", unitCostCents: 32_000, costCents: 787_200, priceCents: 1_144_186 }),
        ],
      }),
      option({
        id: 72,
        label: "Mesh and foil",
        spec: { spacer: "mesh", foil: true },
        belowMinMargin: true,
        totals: { costCents: 1_980_000, priceCents: 2_400_000, taxCents: 70_000, totalCents: 2_470_000, marginPct: 17.5, depositCents: 741_000 },
        lines: [
          line({ id: 3, kind: "material", key: "spacer-mesh", description: "3D mesh mat", quantity: 9, unit: "roll", unitCostCents: 26_500, costCents: 238_500, priceCents: 346_685, taxable: true }),
        ],
      }),
    ],
    ...extra,
  };
}

export function quote(rev: RevisionDetail = revision(), extra: Partial<QuoteDetail> = {}): QuoteDetail {
  return {
    id: 41,
    number: "QSS-1007",
    jobId: 9,
    status: rev.status,
    archived: false,
    createdAt: "2025-03-01T14:00:00.000Z",
    updatedAt: "2025-03-01T14:00:00.000Z",
    revision: rev,
    revisions: [{ id: rev.id, revisionNo: rev.revisionNo, status: rev.status, totalCents: 2_275_244, createdAt: rev.createdAt }],
    ...extra,
  };
}
