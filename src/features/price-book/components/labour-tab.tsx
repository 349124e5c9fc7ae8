import { useEffect } from "react";
import { useFieldArray, useForm, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import {
  LABOR_KINDS,
  laborRatesInputSchema,
  type LaborKind,
  type LaborRateDto,
  type LaborRatesInput,
} from "@shared/schemas/price-book";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { LoadFailed } from "@/components/ui/load-failed";
import { Select } from "@/components/ui/select";
import { LoadingRow } from "@/components/ui/spinner";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { toast } from "@/components/ui/toast";
import { useLaborRates } from "@/lib/queries/price-book";
import { useSaveLabor } from "@/features/price-book/api/mutations";
import { centsToInput, dollarsToCents, formatCents, parseNumber } from "@/lib/money";

const KIND_LABEL: Record<LaborKind, string> = {
  pitch_band: "Pitch band",
  tear_off_per_layer: "Tear-off per layer",
  deck_sheet: "Deck sheet",
  other: "Other",
};

type Row = { kind: LaborKind; label: string; minPitch: string; maxPitch: string; centsPerUnit: string; unit: string };
type FormValues = { rates: Row[] };

const toRow = (r: LaborRateDto): Row => ({
  kind: r.kind,
  label: r.label,
  minPitch: r.minPitch === null ? "" : String(r.minPitch),
  maxPitch: r.maxPitch === null ? "" : String(r.maxPitch),
  centsPerUnit: centsToInput(r.centsPerUnit),
  unit: r.unit,
});

/** The typed rows (dollars, pitch as text) become the API's input, then the shared schema checks it. */
const laborFormSchema = z.preprocess((input: unknown) => {
  const v = input as FormValues;
  const rates = v.rates.map((r) => ({
    kind: r.kind,
    label: r.label,
    minPitch: r.kind === "pitch_band" ? parseNumber(r.minPitch) : null,
    maxPitch: r.kind === "pitch_band" ? parseNumber(r.maxPitch) : null,
    centsPerUnit: dollarsToCents(r.centsPerUnit) ?? undefined,
    unit: r.unit,
  }));
  return { rates };
}, laborRatesInputSchema) as unknown as z.ZodType<LaborRatesInput, FormValues>;

const NEW_ROW: Record<LaborKind, Row> = {
  pitch_band: { kind: "pitch_band", label: "", minPitch: "", maxPitch: "", centsPerUnit: "", unit: "square" },
  tear_off_per_layer: { kind: "tear_off_per_layer", label: "Tear-off per layer", minPitch: "", maxPitch: "", centsPerUnit: "", unit: "square" },
  deck_sheet: { kind: "deck_sheet", label: "Deck sheet replaced", minPitch: "", maxPitch: "", centsPerUnit: "", unit: "sheet" },
  other: { kind: "other", label: "", minPitch: "", maxPitch: "", centsPerUnit: "", unit: "ea" },
};

export function LabourTab({ canEdit }: { canEdit: boolean }) {
  const labor = useLaborRates();
  if (labor.isPending) {
    return (
      <LoadingRow label="Loading labour rates" />
    );
  }
  if (labor.isError) {
    return (
      <LoadFailed title="The labour rates could not be loaded" error={labor.error} onRetry={() => labor.refetch()} />
    );
  }
  return (
    <div className="space-y-3">
      <Alert tone="info" title="How labour is priced">
        Quotes price installation per square by the pitch band of each plane, plus tear-off per existing layer and
        each deck sheet replaced. Charging more on steeper bands is common trade practice (slower work, more staging
        and fall protection), not a published rule: set the steps from your own crews' production. Steep and high
        roofs need fall protection as local regulations require.
      </Alert>
      {canEdit ? <LabourForm rates={labor.data} /> : <LabourReadOnly rates={labor.data} />}
    </div>
  );
}

function pitchRange(r: { minPitch: number | null; maxPitch: number | null }) {
  if (r.minPitch === null) return "—";
  return r.maxPitch === null ? `${r.minPitch}/12 and up` : `${r.minPitch}/12 to under ${r.maxPitch}/12`;
}

function LabourReadOnly({ rates }: { rates: LaborRateDto[] }) {
  return (
    <Table aria-label="Labour rates">
      <THead>
        <tr>
          <Th>Kind</Th>
          <Th>Label</Th>
          <Th>Pitch</Th>
          <Th className="text-right">Rate</Th>
        </tr>
      </THead>
      <TBody>
        {rates.map((r) => (
          <Tr key={r.id}>
            <Td className="py-1.5">{KIND_LABEL[r.kind]}</Td>
            <Td className="py-1.5">{r.label}</Td>
            <Td className="py-1.5 tabular-nums">{pitchRange(r)}</Td>
            <Td className="py-1.5 text-right tabular-nums">
              {formatCents(r.centsPerUnit)}
              <span className="text-steel-500">/{r.unit}</span>
            </Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}

function LabourForm({ rates }: { rates: LaborRateDto[] }) {
  const save = useSaveLabor();
  const {
    register,
    control,
    handleSubmit,
    setError,
    reset,
    watch,
    formState: { errors, isSubmitting, isDirty },
  } = useForm<FormValues, unknown, LaborRatesInput>({
    resolver: zodResolver(laborFormSchema) as unknown as Resolver<FormValues, unknown, LaborRatesInput>,
    defaultValues: { rates: rates.map(toRow) },
  });
  const { fields, append, remove } = useFieldArray({ control, name: "rates" });
  const kinds = watch("rates").map((r) => r.kind);

  useEffect(() => {
    if (!isDirty) reset({ rates: rates.map(toRow) });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [rates]);

  const submit = handleSubmit(async (input) => {
    try {
      const saved = await save.mutateAsync(input);
      reset({ rates: saved.map(toRow) });
      toast.success("Labour rates saved.");
    } catch (err) {
      if (err instanceof ApiError && err.fields) {
        for (const [name, message] of Object.entries(err.fields)) setError(name as `rates.${number}.label`, { message });
        return;
      }
      setError("root", { message: errorMessage(err) });
    }
  });

  const rowError = (i: number, f: keyof Row) => errors.rates?.[i]?.[f]?.message;

  return (
    <form onSubmit={submit} noValidate className="space-y-3">
      {errors.root?.message && <Alert tone="error" title="Not saved">{errors.root.message} Your rows are still here.</Alert>}
      {errors.rates?.root?.message && <Alert tone="error">{errors.rates.root.message}</Alert>}
      <Table aria-label="Labour rates" className="text-[13px]">
        <THead>
          <tr>
            <Th>Kind</Th>
            <Th>Label</Th>
            <Th>From pitch (/12)</Th>
            <Th>Below pitch (/12)</Th>
            <Th>Rate ($)</Th>
            <Th>Per</Th>
            <Th>
              <span className="sr-only">Remove</span>
            </Th>
          </tr>
        </THead>
        <TBody>
          {fields.map((f, i) => {
            const band = kinds[i] === "pitch_band";
            return (
              <Tr key={f.id} className="align-top">
                <Td className="w-44 py-1.5">
                  <Select aria-label={`Kind, row ${i + 1}`} aria-invalid={rowError(i, "kind") ? true : undefined} {...register(`rates.${i}.kind`)}>
                    {LABOR_KINDS.map((k) => (
                      <option key={k} value={k}>
                        {KIND_LABEL[k]}
                      </option>
                    ))}
                  </Select>
                  <CellError message={rowError(i, "kind")} />
                </Td>
                <Td className="py-1.5">
                  <Input aria-label={`Label, row ${i + 1}`} aria-invalid={rowError(i, "label") ? true : undefined} {...register(`rates.${i}.label`)} />
                  <CellError message={rowError(i, "label")} />
                </Td>
                <Td className="w-24 py-1.5">
                  {band ? (
                    <>
                      <Input
                        inputMode="decimal"
                        aria-label={`From pitch (rise per 12), row ${i + 1}`}
                        aria-invalid={rowError(i, "minPitch") ? true : undefined}
                        {...register(`rates.${i}.minPitch`)}
                      />
                      <CellError message={rowError(i, "minPitch")} />
                    </>
                  ) : (
                    <span className="text-xs text-steel-400">any</span>
                  )}
                </Td>
                <Td className="w-24 py-1.5">
                  {band ? (
                    <>
                      <Input
                        inputMode="decimal"
                        placeholder="no limit"
                        aria-label={`Below pitch (rise per 12), row ${i + 1}`}
                        aria-invalid={rowError(i, "maxPitch") ? true : undefined}
                        {...register(`rates.${i}.maxPitch`)}
                      />
                      <CellError message={rowError(i, "maxPitch")} />
                    </>
                  ) : null}
                </Td>
                <Td className="w-28 py-1.5">
                  <Input
                    inputMode="decimal"
                    aria-label={`Rate in dollars, row ${i + 1}`}
                    aria-invalid={rowError(i, "centsPerUnit") ? true : undefined}
                    {...register(`rates.${i}.centsPerUnit`)}
                  />
                  <CellError message={rowError(i, "centsPerUnit")} />
                </Td>
                <Td className="w-24 py-1.5">
                  <Input aria-label={`Unit, row ${i + 1}`} aria-invalid={rowError(i, "unit") ? true : undefined} {...register(`rates.${i}.unit`)} />
                  <CellError message={rowError(i, "unit")} />
                </Td>
                <Td className="w-10 py-1.5 text-right">
                  <Button variant="ghost" size="sm" aria-label={`Remove row ${i + 1}`} onClick={() => remove(i)}>
                    ✕
                  </Button>
                </Td>
              </Tr>
            );
          })}
        </TBody>
      </Table>
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" size="sm" onClick={() => append(NEW_ROW.pitch_band)}>
          Add pitch band
        </Button>
        {!kinds.includes("tear_off_per_layer") && (
          <Button variant="secondary" size="sm" onClick={() => append(NEW_ROW.tear_off_per_layer)}>
            Add tear-off rate
          </Button>
        )}
        {!kinds.includes("deck_sheet") && (
          <Button variant="secondary" size="sm" onClick={() => append(NEW_ROW.deck_sheet)}>
            Add deck-sheet rate
          </Button>
        )}
        <Button variant="secondary" size="sm" onClick={() => append(NEW_ROW.other)}>
          Add other rate
        </Button>
        <div className="ml-auto flex gap-2">
          <Button variant="ghost" disabled={!isDirty || isSubmitting} onClick={() => reset({ rates: rates.map(toRow) })}>
            Discard changes
          </Button>
          <Button type="submit" loading={isSubmitting} disabled={!isDirty}>
            Save labour rates
          </Button>
        </div>
      </div>
    </form>
  );
}

function CellError({ message }: { message?: string }) {
  if (!message) return null;
  return <p className="mt-0.5 text-xs text-danger-700">{message}</p>;
}
