import { useEffect } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { pricingSettingsSchema, type PricingSettingsDto, type PricingSettingsInput } from "@shared/schemas/price-book";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { LoadFailed } from "@/components/ui/load-failed";
import { Select } from "@/components/ui/select";
import { LoadingRow } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { usePricingSettings } from "@/lib/queries/price-book";
import { useSaveSettings } from "@/features/price-book/api/mutations";
import { parseNumber } from "@/lib/money";

type FormValues = z.input<typeof pricingSettingsSchema>;

const pick = (s: PricingSettingsDto): PricingSettingsInput => ({
  pricingMode: s.pricingMode,
  markupPct: s.markupPct,
  targetMarginPct: s.targetMarginPct,
  minMarginPct: s.minMarginPct,
  taxRatePct: s.taxRatePct,
  taxBasis: s.taxBasis,
  depositPct: s.depositPct,
  proposalValidityDays: s.proposalValidityDays,
});

/** Markup or margin, the minimum margin that triggers an approval reason, tax, deposit and validity. */
export function SettingsTab({ canEdit }: { canEdit: boolean }) {
  const settings = usePricingSettings();
  if (settings.isPending) {
    return (
      <LoadingRow label="Loading settings" />
    );
  }
  if (settings.isError) {
    return (
      <LoadFailed title="The pricing settings could not be loaded" error={settings.error} onRetry={() => settings.refetch()} />
    );
  }
  return <SettingsForm settings={settings.data} canEdit={canEdit} />;
}

function SettingsForm({ settings, canEdit }: { settings: PricingSettingsDto; canEdit: boolean }) {
  const save = useSaveSettings();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    watch,
    formState: { errors, isSubmitting, isDirty },
  } = useForm<FormValues, unknown, PricingSettingsInput>({
    resolver: zodResolver(pricingSettingsSchema),
    defaultValues: pick(settings),
  });
  const mode = watch("pricingMode");

  useEffect(() => {
    if (!isDirty) reset(pick(settings));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [settings]);

  const submit = handleSubmit(async (values) => {
    try {
      const saved = await save.mutateAsync(values);
      reset(pick(saved));
      toast.success("Pricing settings saved. New and re-priced quotes use them.");
    } catch (err) {
      if (err instanceof ApiError && err.fields) {
        for (const [name, message] of Object.entries(err.fields)) setError(name as keyof FormValues, { message });
        return;
      }
      setError("root", { message: errorMessage(err) });
    }
  });

  const num = { setValueAs: parseNumber };

  return (
    <form onSubmit={submit} noValidate className="max-w-3xl space-y-4">
      {errors.root?.message && (
        <Alert tone="error" title="Not saved">
          {errors.root.message} Your entries are still here.
        </Alert>
      )}
      <fieldset disabled={!canEdit} className="space-y-4">
        <section className="rounded-lg border border-steel-200 bg-white p-4 shadow-panel">
          <h2 className="text-sm font-semibold text-steel-900">Price and margin</h2>
          <div className="mt-3 grid grid-cols-1 gap-3 sm:grid-cols-4">
            <Field label="Pricing mode" error={errors.pricingMode?.message} className="sm:col-span-2"
              hint={mode === "margin" ? "Price = cost ÷ (1 − target margin)" : "Price = cost × (1 + markup)"}>
              <Select {...register("pricingMode")}>
                <option value="margin">Target margin on the price</option>
                <option value="markup">Markup on cost</option>
              </Select>
            </Field>
            {mode === "markup" ? (
              <Field label="Markup (%)" error={errors.markupPct?.message} className="sm:col-span-2">
                <Input inputMode="decimal" {...register("markupPct", num)} />
              </Field>
            ) : (
              <Field label="Target margin (%)" error={errors.targetMarginPct?.message} className="sm:col-span-2">
                <Input inputMode="decimal" {...register("targetMarginPct", num)} />
              </Field>
            )}
            <Field
              label="Minimum margin (%)"
              error={errors.minMarginPct?.message}
              hint="A quote option below this needs your written reason to approve."
              className="sm:col-span-2"
            >
              <Input inputMode="decimal" {...register("minMarginPct", num)} />
            </Field>
          </div>
        </section>
        <section className="rounded-lg border border-steel-200 bg-white p-4 shadow-panel">
          <h2 className="text-sm font-semibold text-steel-900">Tax, deposit and validity</h2>
          <div className="mt-3 grid grid-cols-1 gap-3 sm:grid-cols-4">
            <Field label="Tax rate (%)" error={errors.taxRatePct?.message}>
              <Input inputMode="decimal" {...register("taxRatePct", num)} />
            </Field>
            <Field label="Tax figured on" error={errors.taxBasis?.message} hint="Materials only, plus taxable manual lines">
              <Select {...register("taxBasis")}>
                <option value="cost">Material cost</option>
                <option value="price">Selling price</option>
              </Select>
            </Field>
            <Field label="Deposit (%)" error={errors.depositPct?.message} hint="Of the total, to the whole dollar">
              <Input inputMode="decimal" {...register("depositPct", num)} />
            </Field>
            <Field label="Proposal valid for (days)" error={errors.proposalValidityDays?.message}>
              <Input inputMode="numeric" {...register("proposalValidityDays", num)} />
            </Field>
          </div>
        </section>
      </fieldset>
      {canEdit ? (
        <div className="flex items-center justify-end gap-2">
          <p className="mr-auto text-xs text-steel-500">Price-book version {settings.priceBookVersion}</p>
          <Button variant="ghost" disabled={!isDirty || isSubmitting} onClick={() => reset(pick(settings))}>
            Discard changes
          </Button>
          <Button type="submit" loading={isSubmitting} disabled={!isDirty}>
            Save settings
          </Button>
        </div>
      ) : (
        <p className="text-xs text-steel-500">Only an owner can change the pricing settings.</p>
      )}
    </form>
  );
}
