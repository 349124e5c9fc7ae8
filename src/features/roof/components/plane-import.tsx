import { useMemo, useRef, useState } from "react";
import { ROOF_CSV_COLUMNS, ROOF_CSV_MAX_BYTES, defaultImportStack, parseRoofCsv, type RoofCsvResult } from "@shared/roof-csv";
import { slopedAreaOf } from "../lib/plane-area";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { toast } from "@/components/ui/toast";
import { ApiError, errorMessage } from "@/lib/api-client";
import { useRoof } from "@/lib/queries/roof";
import { useRoofDraft } from "../api/roof-draft";
import { useCommitPlaneImport } from "../api/mutations";

type Preview = { file: File; version: number; result: RoofCsvResult };

const fmt = (n: number) => n.toLocaleString(undefined, { maximumFractionDigits: 1 });

/**
 * Planes from a CSV: the file is read here with the same parser as the server, shown with its row
 * errors, and only "Add these planes" sends it (the server checks it again and saves a new roof version).
 */
export function PlaneImport({ jobId }: { jobId: number }) {
  const roof = useRoof(jobId);
  const draft = useRoofDraft(jobId);
  const commit = useCommitPlaneImport(jobId);
  const inputRef = useRef<HTMLInputElement>(null);
  const [preview, setPreview] = useState<Preview | null>(null);
  const [problem, setProblem] = useState<string | null>(null);

  const read = async (file: File) => {
    setProblem(null);
    commit.reset();
    if (!roof.data) return;
    if (file.size > ROOF_CSV_MAX_BYTES) {
      setPreview(null);
      setProblem("The CSV is larger than 1 MB; split it into smaller files.");
      return;
    }
    const text = await file.text();
    const stacks = roof.data.stacks.length ? roof.data.stacks.map((s) => s.id) : [defaultImportStack().id];
    const result = parseRoofCsv(text, {
      existingIds: roof.data.planes.map((p) => p.id),
      stackIds: stacks,
      existingCount: roof.data.planes.length,
    });
    setPreview({ file, version: roof.data.version, result });
  };

  const errorsByRow = useMemo(() => {
    const m = new Map<number, string[]>();
    for (const e of preview?.result.errors ?? []) m.set(e.row, [...(m.get(e.row) ?? []), `${e.column}: ${e.message}`]);
    return m;
  }, [preview]);

  const add = async () => {
    if (!preview) return;
    try {
      const res = await commit.mutateAsync({ file: preview.file, version: preview.version });
      toast.success(`${res.planes.length} ${res.planes.length === 1 ? "plane" : "planes"} added to the roof (version ${res.roof.version})`);
      setPreview(null);
    } catch (err) {
      if (err instanceof ApiError && err.status === 409) {
        setProblem("Someone saved the roof after this preview. Choose the file again to preview it against the current roof.");
        void roof.refetch();
      } else setProblem(errorMessage(err));
    }
  };

  const unsaved = Boolean(draft?.dirty);
  const ok = preview && preview.result.errors.length === 0 && preview.result.planes.length > 0;

  return (
    <section aria-labelledby="plane-import-title" className="space-y-3 rounded-lg border border-steel-200 bg-white p-3 shadow-panel">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <h3 id="plane-import-title" className="text-sm font-semibold text-steel-900">
            Roof planes from a spreadsheet
          </h3>
          <p className="mt-0.5 max-w-prose text-xs text-steel-600">
            One row per plane: <code className="text-[11px]">{ROOF_CSV_COLUMNS.join(", ")}</code>. Shapes: rectangle, triangle,
            trapezoid (by their sizes in feet) or outline (<code className="text-[11px]">"x1 y1; x2 y2; …"</code>). Pitch as 6 or
            6/12. Nothing is saved until you add the planes.
          </p>
        </div>
        <div className="flex gap-2">
          <a
            href={`/api/jobs/${jobId}/roof/export.csv`}
            download
            className="inline-flex h-10 items-center rounded-md border border-steel-300 bg-white px-3 text-sm font-medium text-steel-800 shadow-sm hover:bg-steel-50 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500 sm:h-8"
          >
            Export planes (CSV)
          </a>
          <Button variant="secondary" className="h-10 sm:h-8" onClick={() => inputRef.current?.click()} disabled={!roof.data}>
            Choose a CSV…
          </Button>
          <input
            ref={inputRef}
            type="file"
            accept=".csv,text/csv,text/plain"
            className="sr-only"
            aria-label="Choose a CSV of roof planes"
            tabIndex={-1}
            onChange={(e) => {
              const f = e.currentTarget.files?.[0];
              e.currentTarget.value = "";
              if (f) void read(f);
            }}
          />
        </div>
      </div>

      {roof.isPending && <Spinner label="Loading the roof" />}
      {roof.isError && <Alert tone="error">The roof could not be loaded: {errorMessage(roof.error)}</Alert>}
      {problem && (
        <Alert tone="error" onDismiss={() => setProblem(null)}>
          {problem}
        </Alert>
      )}

      {preview && (
        <div className="space-y-2">
          <p className="text-sm text-steel-800">
            <strong>{preview.file.name}</strong>: {preview.result.planes.length} {preview.result.planes.length === 1 ? "plane" : "planes"} read
            {preview.result.errors.length > 0 && (
              <>
                , <span className="font-semibold text-danger-700">{errorsByRow.size} {errorsByRow.size === 1 ? "row" : "rows"} with problems</span>
              </>
            )}
            .
          </p>
          {preview.result.errors.length > 0 && (
            <Alert tone="error" title="Fix these rows in the spreadsheet, then choose the file again">
              <ul className="list-disc space-y-0.5 pl-4">
                {preview.result.errors.map((e, i) => (
                  <li key={i}>
                    Row {e.row}, {e.column}: {e.message}
                  </li>
                ))}
              </ul>
            </Alert>
          )}
          {preview.result.planes.length > 0 && (
            <Table aria-label="Planes in the file">
              <THead>
                <tr>
                  <Th>Row</Th>
                  <Th>Name</Th>
                  <Th className="text-right">Pitch</Th>
                  <Th className="text-right">Corners</Th>
                  <Th className="text-right">Plan area ft²</Th>
                  <Th className="text-right">Roof area ft²</Th>
                  <Th>Stack</Th>
                </tr>
              </THead>
              <TBody>
                {preview.result.planes.map((p, i) => {
                  const area = slopedAreaOf(p);
                  return (
                    <Tr key={p.id}>
                      <Td>{preview.result.rows[i]}</Td>
                      <Td>{p.name || <span className="text-steel-500">(no name)</span>}</Td>
                      <Td className="text-right tabular-nums">{p.pitch}/12</Td>
                      <Td className="text-right tabular-nums">{p.outline.length}</Td>
                      <Td className="text-right tabular-nums">{fmt(area.plan)}</Td>
                      <Td className="text-right tabular-nums">{fmt(area.sloped)}</Td>
                      <Td>{p.stackId ?? <span className="text-steel-500">default</span>}</Td>
                    </Tr>
                  );
                })}
              </TBody>
            </Table>
          )}
          {unsaved && (
            <Alert tone="caution">
              The roof sketch has changes that are not saved. Save or discard them in the Roof sketch first: adding planes here
              saves a new version of the roof.
            </Alert>
          )}
          <div className="flex flex-wrap gap-2">
            <Button onClick={add} disabled={!ok || unsaved} loading={commit.isPending} className="h-10 sm:h-8">
              Add these planes
            </Button>
            <Button variant="ghost" className="h-10 sm:h-8" onClick={() => setPreview(null)} disabled={commit.isPending}>
              Cancel
            </Button>
          </div>
        </div>
      )}
    </section>
  );
}
