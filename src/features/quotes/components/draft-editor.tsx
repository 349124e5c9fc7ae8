import { useEffect, useMemo, useState } from "react";
import { useFieldArray, useForm, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { MAX_QUOTE_OPTIONS, QUOTE_SPACERS, type QuoteDetail, type QuotePatchInput, type RevisionDetail } from "@shared/schemas/quote";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Textarea } from "@/components/ui/textarea";
import { Select } from "@/components/ui/select";
import { toast } from "@/components/ui/toast";
import { isNotDraft, isStaleVersion, usePatchQuote } from "@/features/quotes/api/mutations";
import { KIND_LABEL, SPACER_LABEL } from "@/features/quotes/components/options-comparison";
import {
  EMPTY_MANUAL,
  EMPTY_OVERRIDE,
  draftFormSchema,
  toDraftValues,
  type DraftFormValues,
} from "@/features/quotes/lib/draft-form";

type Props = {
  quoteId: number;
  revision: RevisionDetail;
  /** Reloads the quote from the server (after a stale-version refusal). */
  onReload: () => Promise<unknown>;
  /** Tells the section whether there are unsaved edits (submit waits for a save). */
  onDirtyChange?: (dirty: boolean) => void;
};

const sectionClass = "rounded-lg border border-steel-200 bg-white p-3 shadow-panel";
const h3 = "text-xs font-semibold uppercase tracking-wide text-steel-600";

/**
 * Edits a draft revision: options, manual lines, overrides (each with a reason), a discount with a reason and
 * the notes to the owner; saved with one PATCH carrying the version the draft was loaded at. A stale version
 * keeps everything typed and offers to load the latest version first.
 */
export function DraftEditor({ quoteId, revision, onReload, onDirtyChange }: Props) {
  const patch = usePatchQuote(quoteId);
  const [conflict, setConflict] = useState<string | null>(null);
  const [reloading, setReloading] = useState(false);

  const form = useForm<DraftFormValues, unknown, QuotePatchInput>({
    resolver: zodResolver(draftFormSchema) as unknown as Resolver<DraftFormValues, unknown, QuotePatchInput>,
    defaultValues: toDraftValues(revision),
  });
  const {
    register,
    control,
    handleSubmit,
    setError,
    reset,
    watch,
    formState: { errors, isSubmitting, isDirty },
  } = form;
  const options = useFieldArray({ control, name: "options" });
  const manual = useFieldArray({ control, name: "manualLines" });
  const overrides = useFieldArray({ control, name: "overrides" });
  const discountOn = watch("discountOn");

  useEffect(() => onDirtyChange?.(isDirty), [isDirty, onDirtyChange]);

  // a newer version from the server replaces the form only when nothing is typed
  useEffect(() => {
    if (!isDirty) reset(toDraftValues(revision));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [revision.id, revision.version]);

  const overrideKeys = useMemo(() => {
    const m = new Map<string, string>();
    for (const o of revision.options)
      for (const l of o.lines) if (l.key && l.kind !== "manual" && l.kind !== "discount" && !m.has(l.key)) m.set(l.key, `${KIND_LABEL[l.kind]}: ${l.description}`);
    for (const o of revision.overrides) if (!m.has(o.key)) m.set(o.key, o.key);
    return [...m.entries()];
  }, [revision]);

  const submit = handleSubmit(async (values) => {
    setConflict(null);
    try {
      const saved: QuoteDetail = await patch.mutateAsync({ ...values, version: revision.version });
      reset(toDraftValues(saved.revision));
      toast.success("Draft saved and re-priced.");
    } catch (err) {
      if (isStaleVersion(err)) {
        setConflict("Someone else saved this draft after you opened it.");
        return;
      }
      if (isNotDraft(err)) {
        setConflict("This quote is no longer a draft (it was submitted or changed state).");
        return;
      }
      if (err instanceof ApiError && err.fields) {
        for (const [name, message] of Object.entries(err.fields)) setError(name as keyof DraftFormValues, { message });
        toast.error("Not saved: check the highlighted fields.");
        return;
      }
      setError("root", { message: errorMessage(err) });
      toast.error("The draft was not saved.");
    }
  });

  const reload = async () => {
    setReloading(true);
    try {
      await onReload();
      setConflict(null);
      toast.info("Loaded the latest version. Your edits are still in the form: save to apply them on top of it.");
    } finally {
      setReloading(false);
    }
  };

  const optionChoices = revision.options.map((o) => ({ id: o.id, label: o.label }));
  const err = (m?: { message?: string }) => m?.message;

  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Edit draft">
      {conflict && (
        <Alert tone="caution" title="Changed by someone else: not saved">
          <p>{conflict} Nothing you typed is lost. Load the latest version, check it, then save again.</p>
          <Button size="sm" variant="secondary" className="mt-2" loading={reloading} onClick={() => void reload()}>
            Load the latest version
          </Button>
        </Alert>
      )}
      {errors.root?.message && (
        <Alert tone="error" title="Not saved">
          {errors.root.message} Your edits are still here.
        </Alert>
      )}

      <section className={sectionClass} aria-labelledby="draft-options">
        <div className="mb-2 flex items-center justify-between">
          <h3 id="draft-options" className={h3}>
            Options
          </h3>
          <Button
            size="sm"
            variant="secondary"
            disabled={options.fields.length >= MAX_QUOTE_OPTIONS}
            onClick={() => options.append({ optionId: null, label: "", spec: { spacer: "", foil: "", stackId: "" } })}
          >
            Add option
          </Button>
        </div>
        {errors.options?.root?.message && <p className="mb-1 text-xs text-danger-700">{errors.options.root.message}</p>}
        {errors.options?.message && <p className="mb-1 text-xs text-danger-700">{errors.options.message}</p>}
        <div className="space-y-2">
          {options.fields.map((f, i) => (
            <div key={f.id} className="grid grid-cols-1 items-start gap-2 sm:grid-cols-[2rem_1fr_11rem_9rem_auto]">
              <span className="hidden pt-1.5 text-xs font-semibold text-steel-500 sm:block">{String.fromCharCode(65 + i)}</span>
              <Field label={`Option ${String.fromCharCode(65 + i)} name`} error={err(errors.options?.[i]?.label)}>
                <Input {...register(`options.${i}.label`)} />
              </Field>
              <Field label="Spacer" error={err(errors.options?.[i]?.spec?.spacer)}>
                <Select {...register(`options.${i}.spec.spacer`)}>
                  <option value="">As designed</option>
                  {QUOTE_SPACERS.map((s) => (
                    <option key={s} value={s}>
                      {SPACER_LABEL[s]}
                    </option>
                  ))}
                </Select>
              </Field>
              <Field label="Foil" error={err(errors.options?.[i]?.spec?.foil)}>
                <Select {...register(`options.${i}.spec.foil`)}>
                  <option value="">As designed</option>
                  <option value="yes">Add foil</option>
                  <option value="no">No foil</option>
                </Select>
              </Field>
              <Button
                variant="ghost"
                size="sm"
                className="sm:mt-5"
                disabled={options.fields.length <= 1}
                onClick={() => options.remove(i)}
                aria-label={`Remove option ${String.fromCharCode(65 + i)}`}
              >
                Remove
              </Button>
            </div>
          ))}
        </div>
        <p className="mt-2 text-xs text-steel-500">
          Each option re-runs the takeoff with its spacer and foil applied to every plane's assembly.
        </p>
      </section>

      <section className={sectionClass} aria-labelledby="draft-manual">
        <div className="mb-2 flex items-center justify-between">
          <h3 id="draft-manual" className={h3}>
            Manual lines
          </h3>
          <Button size="sm" variant="secondary" onClick={() => manual.append(EMPTY_MANUAL)}>
            Add manual line
          </Button>
        </div>
        {manual.fields.length === 0 ? (
          <p className="text-xs text-steel-500">None. Add permits, dumpsters, skylights or anything the takeoff does not count.</p>
        ) : (
          <div className="space-y-2">
            {manual.fields.map((f, i) => (
              <div key={f.id} className="grid grid-cols-2 items-start gap-2 md:grid-cols-[9rem_1fr_5rem_7rem_7rem_auto_auto]">
                <Field label="Applies to" error={err(errors.manualLines?.[i]?.optionId)}>
                  <Select {...register(`manualLines.${i}.optionId`)}>
                    <option value="">All options</option>
                    {optionChoices.map((o) => (
                      <option key={o.id} value={String(o.id)}>
                        {o.label}
                      </option>
                    ))}
                  </Select>
                </Field>
                <Field label="Description" error={err(errors.manualLines?.[i]?.description)} className="col-span-2 md:col-span-1">
                  <Input {...register(`manualLines.${i}.description`)} />
                </Field>
                <Field label="Qty" error={err(errors.manualLines?.[i]?.quantity)}>
                  <Input inputMode="decimal" {...register(`manualLines.${i}.quantity`)} />
                </Field>
                <Field label="Unit price ($)" error={err(errors.manualLines?.[i]?.unitPriceCents)}>
                  <Input inputMode="decimal" {...register(`manualLines.${i}.unitPriceCents`)} />
                </Field>
                <Field label="Unit cost ($)" error={err(errors.manualLines?.[i]?.unitCostCents)}>
                  <Input inputMode="decimal" placeholder="= price" {...register(`manualLines.${i}.unitCostCents`)} />
                </Field>
                <label className="flex h-8 items-center gap-1.5 self-end text-xs text-steel-700">
                  <input type="checkbox" className="size-4 accent-accent-700" {...register(`manualLines.${i}.taxable`)} />
                  Taxable
                </label>
                <Button variant="ghost" size="sm" className="self-end" onClick={() => manual.remove(i)} aria-label={`Remove manual line ${i + 1}`}>
                  Remove
                </Button>
              </div>
            ))}
          </div>
        )}
      </section>

      <section className={sectionClass} aria-labelledby="draft-overrides">
        <div className="mb-2 flex items-center justify-between">
          <h3 id="draft-overrides" className={h3}>
            Overrides
          </h3>
          <Button size="sm" variant="secondary" onClick={() => overrides.append(EMPTY_OVERRIDE)} disabled={overrideKeys.length === 0}>
            Add override
          </Button>
        </div>
        {overrides.fields.length === 0 ? (
          <p className="text-xs text-steel-500">
            None. An override replaces a line's unit cost or quantity; it needs a reason, and the owner sees it.
          </p>
        ) : (
          <div className="space-y-2">
            {overrides.fields.map((f, i) => (
              <div key={f.id} className="grid grid-cols-2 items-start gap-2 md:grid-cols-[9rem_1.2fr_7rem_5rem_1fr_auto]">
                <Field label="Applies to" error={err(errors.overrides?.[i]?.optionId)}>
                  <Select {...register(`overrides.${i}.optionId`)}>
                    <option value="">All options</option>
                    {optionChoices.map((o) => (
                      <option key={o.id} value={String(o.id)}>
                        {o.label}
                      </option>
                    ))}
                  </Select>
                </Field>
                <Field label="Line" error={err(errors.overrides?.[i]?.key)}>
                  <Select {...register(`overrides.${i}.key`)}>
                    <option value="">Pick a line…</option>
                    {overrideKeys.map(([k, label]) => (
                      <option key={k} value={k}>
                        {label}
                      </option>
                    ))}
                  </Select>
                </Field>
                <Field label="Unit cost ($)" error={err(errors.overrides?.[i]?.unitCostCents)}>
                  <Input inputMode="decimal" placeholder="unchanged" {...register(`overrides.${i}.unitCostCents`)} />
                </Field>
                <Field label="Qty" error={err(errors.overrides?.[i]?.quantity)}>
                  <Input inputMode="decimal" placeholder="same" {...register(`overrides.${i}.quantity`)} />
                </Field>
                <Field label="Reason (required)" error={err(errors.overrides?.[i]?.reason)} className="col-span-2 md:col-span-1">
                  <Input {...register(`overrides.${i}.reason`)} />
                </Field>
                <Button variant="ghost" size="sm" className="self-end" onClick={() => overrides.remove(i)} aria-label={`Remove override ${i + 1}`}>
                  Remove
                </Button>
              </div>
            ))}
          </div>
        )}
      </section>

      <div className="grid grid-cols-1 gap-3 lg:grid-cols-2">
        <section className={sectionClass} aria-labelledby="draft-discount">
          <h3 id="draft-discount" className={h3}>
            Discount
          </h3>
          <label className="mt-2 flex items-center gap-1.5 text-sm text-steel-700">
            <input type="checkbox" className="size-4 accent-accent-700" {...register("discountOn")} />
            Give a discount on every option
          </label>
          {discountOn && (
            <div className="mt-2 grid grid-cols-[8rem_1fr] gap-2">
              <Field label="Amount ($)" error={err(errors.discount?.amountCents)}>
                <Input inputMode="decimal" {...register("discount.amountCents")} />
              </Field>
              <Field label="Reason (required)" error={err(errors.discount?.reason)}>
                <Input {...register("discount.reason")} />
              </Field>
            </div>
          )}
        </section>
        <section className={sectionClass}>
          <Field label={<span className={h3}>Notes to the owner</span>} error={err(errors.notes)}>
            <Textarea rows={3} {...register("notes")} />
          </Field>
        </section>
      </div>

      <div className={cn(isDirty && "sticky bottom-0 z-10", "-mx-1 flex items-center justify-end gap-2 border-t border-steel-200 bg-steel-50/95 px-1 py-2 backdrop-blur")}>
        {isDirty && <p className="mr-auto text-xs text-steel-600">Unsaved changes: the figures above update when you save.</p>}
        <Button variant="ghost" disabled={!isDirty || isSubmitting} onClick={() => reset(toDraftValues(revision))}>
          Discard changes
        </Button>
        <Button type="submit" loading={isSubmitting} disabled={!isDirty}>
          Save draft
        </Button>
      </div>
    </form>
  );
}
