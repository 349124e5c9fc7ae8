/**
 * The Pricing section's draft form: what a person types (dollars and numbers as text, "" for "not set") and
 * how it becomes the PATCH body checked by the shared `quotePatchSchema`. Field names follow the API's, so a
 * server field error (`overrides.0.reason`) lands on the same input.
 */
import { z } from "zod";
import { quotePatchSchema, type QuotePatchInput, type RevisionDetail } from "@shared/schemas/quote";
import { centsToInput, dollarsToCents, parseNumber } from "@/lib/money";

export type DraftOptionRow = { optionId: number | null; label: string; spec: { spacer: string; foil: "" | "yes" | "no"; stackId: string } };
export type DraftManualRow = {
  optionId: string;
  description: string;
  quantity: string;
  unitPriceCents: string;
  unitCostCents: string;
  taxable: boolean;
};
export type DraftOverrideRow = { optionId: string; key: string; unitCostCents: string; quantity: string; reason: string };

export type DraftFormValues = {
  notes: string;
  options: DraftOptionRow[];
  manualLines: DraftManualRow[];
  overrides: DraftOverrideRow[];
  discountOn: boolean;
  discount: { amountCents: string; reason: string };
};

const optNum = (v: string) => {
  const n = parseNumber(v);
  return n === null ? undefined : n;
};
const optCents = (v: string) => {
  const n = dollarsToCents(v);
  return n === null ? undefined : n;
};
const optionRef = (v: string) => (v === "" ? null : Number(v));

/** The typed values as the PATCH body (without the version, which the save adds). */
export function toPatchBody(v: DraftFormValues) {
  return {
    notes: v.notes.trim() === "" ? null : v.notes,
    options: v.options.map((o) => ({
      ...(o.optionId !== null ? { id: o.optionId } : {}),
      label: o.label,
      spec: {
        ...(o.spec.spacer ? { spacer: o.spec.spacer } : {}),
        ...(o.spec.foil ? { foil: o.spec.foil === "yes" } : {}),
        ...(o.spec.stackId ? { stackId: o.spec.stackId } : {}),
      },
    })),
    manualLines: v.manualLines.map((m) => ({
      optionId: optionRef(m.optionId),
      description: m.description,
      quantity: parseNumber(m.quantity) ?? undefined,
      unitPriceCents: dollarsToCents(m.unitPriceCents) ?? undefined,
      unitCostCents: optCents(m.unitCostCents),
      taxable: m.taxable,
    })),
    overrides: v.overrides.map((o) => ({
      optionId: optionRef(o.optionId),
      key: o.key,
      unitCostCents: optCents(o.unitCostCents),
      quantity: optNum(o.quantity),
      reason: o.reason,
    })),
    discount: v.discountOn
      ? { amountCents: dollarsToCents(v.discount.amountCents) ?? undefined, reason: v.discount.reason }
      : null,
  };
}

/** The form's schema: the typed values converted, then the shared PATCH schema (with a placeholder version). */
export const draftFormSchema = z.preprocess(
  (input: unknown) => ({ ...toPatchBody(input as DraftFormValues), version: 1 }),
  quotePatchSchema,
) as unknown as z.ZodType<QuotePatchInput, DraftFormValues>;

export function toDraftValues(r: RevisionDetail): DraftFormValues {
  return {
    notes: r.notes ?? "",
    options: r.options.map((o) => ({
      optionId: o.id,
      label: o.label,
      spec: {
        spacer: o.spec.spacer ?? "",
        foil: o.spec.foil === undefined ? "" : o.spec.foil ? "yes" : "no",
        stackId: o.spec.stackId ?? "",
      },
    })),
    manualLines: r.manualLines.map((m) => ({
      optionId: m.optionId === null ? "" : String(m.optionId),
      description: m.description,
      quantity: String(m.quantity),
      unitPriceCents: centsToInput(m.unitPriceCents),
      unitCostCents: m.unitCostCents === undefined || m.unitCostCents === null ? "" : centsToInput(m.unitCostCents),
      taxable: m.taxable,
    })),
    overrides: r.overrides.map((o) => ({
      optionId: o.optionId === null ? "" : String(o.optionId),
      key: o.key,
      unitCostCents: o.unitCostCents === undefined || o.unitCostCents === null ? "" : centsToInput(o.unitCostCents),
      quantity: o.quantity === undefined || o.quantity === null ? "" : String(o.quantity),
      reason: o.reason,
    })),
    discountOn: r.discount !== null,
    discount: r.discount ? { amountCents: centsToInput(r.discount.amountCents), reason: r.discount.reason } : { amountCents: "", reason: "" },
  };
}

export const EMPTY_MANUAL: DraftManualRow = { optionId: "", description: "", quantity: "1", unitPriceCents: "", unitCostCents: "", taxable: false };
export const EMPTY_OVERRIDE: DraftOverrideRow = { optionId: "", key: "", unitCostCents: "", quantity: "", reason: "" };
