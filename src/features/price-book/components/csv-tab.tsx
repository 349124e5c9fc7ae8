import { useRef, useState } from "react";
import { CSV_COLUMNS, CSV_REQUIRED_COLUMNS, type CsvRowError, type PriceBookImportPreview } from "@shared/schemas/price-book";
import { errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { toast } from "@/components/ui/toast";
import { ImportRefused, useImportCsv } from "@/features/price-book/api/mutations";

const ACTION_TONE = { create: "accent", update: "neutral", unchanged: "muted" } as const;
const ACTION_LABEL = { create: "New", update: "Update", unchanged: "Unchanged" } as const;

/** Export the price book; import a CSV in two steps: check (preview with errors by row and column), then save. */
export function CsvTab({ canEdit }: { canEdit: boolean }) {
  const importCsv = useImportCsv();
  const inputRef = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<PriceBookImportPreview | null>(null);
  const [refusal, setRefusal] = useState<{ message: string; errors: CsvRowError[] } | null>(null);
  const [fileError, setFileError] = useState<string | undefined>();

  const run = async (commit: boolean) => {
    if (!file) {
      setFileError("Choose a CSV file (.csv)");
      return;
    }
    setFileError(undefined);
    setRefusal(null);
    try {
      const result = await importCsv.mutateAsync({ file, commit });
      setPreview(result);
      if (result.committed) {
        toast.success(
          `Price book updated: ${result.summary.create} new, ${result.summary.update} updated, ${result.summary.unchanged} unchanged.`,
        );
      }
    } catch (err) {
      if (err instanceof ImportRefused) {
        if (err.fields?.file) setFileError(err.fields.file);
        if (err.preview) setPreview(err.preview);
        setRefusal({ message: err.message, errors: err.errors });
        return;
      }
      setRefusal({ message: errorMessage(err), errors: [] });
    }
  };

  const errors = preview?.errors.length ? preview.errors : (refusal?.errors ?? []);
  const changed = preview ? preview.rows.filter((r) => r.action !== "unchanged") : [];

  return (
    <div className="grid grid-cols-1 gap-4 lg:grid-cols-3">
      <section className="rounded-lg border border-steel-200 bg-white p-4 shadow-panel">
        <h2 className="text-sm font-semibold text-steel-900">Export</h2>
        <p className="mt-1 text-sm text-steel-600">
          Every item, active and archived, one row each, in the same columns the import reads. Edit it in a spreadsheet
          and import it back.
        </p>
        <a
          href="/api/price-book/export.csv"
          download
          className="mt-3 inline-flex h-8 items-center rounded-md border border-steel-300 bg-white px-3 text-sm font-medium text-steel-800 shadow-sm hover:bg-steel-50 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
        >
          Download price book (CSV)
        </a>
        <details className="mt-4 text-xs text-steel-600">
          <summary className="cursor-pointer font-medium text-steel-700">Columns</summary>
          <p className="mt-1">
            Required: {CSV_REQUIRED_COLUMNS.join(", ")}. Optional: {CSV_COLUMNS.filter((c) => !(CSV_REQUIRED_COLUMNS as readonly string[]).includes(c)).join(", ")}.
            Unit cost in dollars (12.50). Rows match items by SKU: new SKUs are added, nothing is deleted.
          </p>
        </details>
      </section>

      <section className="rounded-lg border border-steel-200 bg-white p-4 shadow-panel lg:col-span-2">
        <h2 className="text-sm font-semibold text-steel-900">Import</h2>
        {!canEdit ? (
          <p className="mt-1 text-sm text-steel-600">Only an owner can import a price book.</p>
        ) : (
          <>
            <p className="mt-1 text-sm text-steel-600">
              Check the file first: nothing is saved until every row is valid and you choose Save.
            </p>
            <div className="mt-3 flex flex-wrap items-end gap-2">
              <Field id="pb-csv-file" label="CSV file" error={fileError} className="min-w-64 flex-1">
                <input
                  id="pb-csv-file"
                  aria-invalid={fileError ? true : undefined}
                  aria-describedby={fileError ? "pb-csv-file-error" : undefined}
                  ref={inputRef}
                  type="file"
                  accept=".csv,text/csv"
                  className="block w-full text-sm text-steel-700 file:mr-3 file:h-8 file:rounded-md file:border file:border-steel-300 file:bg-white file:px-3 file:text-sm file:font-medium file:text-steel-800 hover:file:bg-steel-50"
                  onChange={(e) => {
                    setFile(e.target.files?.[0] ?? null);
                    setPreview(null);
                    setRefusal(null);
                    setFileError(undefined);
                  }}
                />
              </Field>
              <Button variant="secondary" onClick={() => void run(false)} loading={importCsv.isPending && !importCsv.variables?.commit}>
                Check file
              </Button>
              <Button
                onClick={() => void run(true)}
                disabled={!preview || !preview.valid || preview.committed || changed.length === 0}
                loading={importCsv.isPending && importCsv.variables?.commit}
              >
                Save {changed.length > 0 ? `${changed.length} ${changed.length === 1 ? "change" : "changes"}` : "changes"}
              </Button>
            </div>

            {refusal && (
              <Alert tone="error" className="mt-3" title="Nothing was saved">
                {refusal.message}
              </Alert>
            )}

            {preview && (
              <div className="mt-3 space-y-3">
                <p className="flex flex-wrap items-center gap-2 text-sm">
                  {preview.committed ? <Badge tone="ok">Saved</Badge> : preview.valid ? <Badge tone="ok">Ready to save</Badge> : <Badge tone="accent">Fix the errors below</Badge>}
                  <span className="text-steel-700">
                    {preview.summary.create} new · {preview.summary.update} updated · {preview.summary.unchanged} unchanged
                  </span>
                </p>
                {preview.warnings.length > 0 && (
                  <Alert tone="caution" title="Warnings">
                    <ul className="list-disc pl-4">
                      {preview.warnings.map((w) => (
                        <li key={w}>{w}</li>
                      ))}
                    </ul>
                  </Alert>
                )}
              </div>
            )}

            {errors.length > 0 && (
              <div className="mt-3">
                <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-danger-700">
                  {errors.length} {errors.length === 1 ? "problem" : "problems"} in {new Set(errors.map((e) => e.row)).size}{" "}
                  {new Set(errors.map((e) => e.row)).size === 1 ? "row" : "rows"}
                </h3>
                <Table aria-label="Import errors" className="text-[13px]">
                  <THead>
                    <tr>
                      <Th>Row</Th>
                      <Th>Column</Th>
                      <Th>Problem</Th>
                    </tr>
                  </THead>
                  <TBody>
                    {errors.map((e, i) => (
                      <Tr key={`${e.row}-${e.column}-${i}`}>
                        <Td className="py-1 tabular-nums">{e.row}</Td>
                        <Td className="py-1">
                          <code className="text-xs">{e.column || "—"}</code>
                        </Td>
                        <Td className="py-1 text-danger-700">{e.message}</Td>
                      </Tr>
                    ))}
                  </TBody>
                </Table>
              </div>
            )}

            {preview && changed.length > 0 && (
              <div className="mt-3">
                <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-steel-600">What changes</h3>
                <Table aria-label="Import preview" className="text-[13px]">
                  <THead>
                    <tr>
                      <Th>Row</Th>
                      <Th>SKU</Th>
                      <Th>Action</Th>
                      <Th>Changes</Th>
                    </tr>
                  </THead>
                  <TBody>
                    {changed.map((r) => (
                      <Tr key={r.row}>
                        <Td className="py-1 tabular-nums">{r.row}</Td>
                        <Td className="py-1 font-mono text-xs">{r.sku}</Td>
                        <Td className="py-1">
                          <Badge tone={ACTION_TONE[r.action]}>{ACTION_LABEL[r.action]}</Badge>
                        </Td>
                        <Td className="py-1 text-steel-600">{r.changes.join("; ") || "—"}</Td>
                      </Tr>
                    ))}
                  </TBody>
                </Table>
              </div>
            )}
          </>
        )}
      </section>
    </div>
  );
}
