/**
 * The selected plane's properties: name, pitch (rise/12 with degrees), eave edge, layer stack, exact
 * corner coordinates, edge lengths and types, penetrations. Every field commits one undo step.
 */
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import type { EdgeType } from "@shared/engine/roof/edge-types";
import { slopeAngleDeg } from "@shared/engine/roof/slope";
import type { PlaneResult } from "@shared/engine/types";
import { PENETRATION_KINDS, penetrationSchema } from "@shared/schemas/takeoff";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";
import type { DraftPlane, DraftStack } from "@/features/roof/api/roof-draft";
import { cn } from "@/lib/cn";
import { CommitInput } from "./commit-input";
import { EDGE_STYLES, EDGE_TYPE_LIST, EdgeSwatch, UNTYPED_STYLE } from "./edge-styles";
import type { Penetration, SketchIntent } from "./edits";
import { edgeLength, feetInches, ftText, parseFeet, slopedAreaOf, planArea, validEaveEdges, withEdgeLength, type Pt } from "./geometry";
import type { Selection } from "./types";

interface Props {
  plane: DraftPlane;
  planeResult: PlaneResult | null;
  stacks: DraftStack[];
  defaultStackId: string;
  selection: NonNullable<Selection>;
  onSelect: (s: Selection) => void;
  dispatch: (intent: SketchIntent) => void;
  readOnly: boolean;
}

const numberParse = (min: number, max: number, what: string) => (t: string) => {
  const n = Number(t.trim());
  if (t.trim() === "" || !Number.isFinite(n)) return { ok: false as const, error: `Enter ${what} as a number` };
  if (n < min || n > max) return { ok: false as const, error: `Use ${min} to ${max}` };
  return { ok: true as const };
};
const feetParse = (t: string) => (parseFeet(t) === null ? { ok: false as const, error: "Enter feet, e.g. 23.5 or 23' 6\"" } : { ok: true as const });
const positiveFeetParse = (t: string) => {
  const v = parseFeet(t);
  return v === null || !(v > 0) ? { ok: false as const, error: "Enter a length over 0, e.g. 23' 6\"" } : { ok: true as const };
};

export const stackLabel = (s: DraftStack) => s.name || s.id;

/** Types of edge i from the engine (several when the edge is split where a neighbour's edge ends). */
function edgeTypesOf(planeResult: PlaneResult | null, i: number): { types: EdgeType[]; trueLength: number | null; overridden: boolean } {
  const pieces = planeResult?.edges.filter((e) => e.index === i) ?? [];
  if (!pieces.length) return { types: [], trueLength: null, overridden: false };
  return {
    types: [...new Set(pieces.map((p) => p.type))],
    trueLength: pieces.reduce((s, p) => s + p.trueLengthFt, 0),
    overridden: pieces.some((p) => p.overridden),
  };
}

export function PlaneInspector({ plane, planeResult, stacks, defaultStackId, selection, onSelect, dispatch, readOnly }: Props) {
  const outline = plane.outline as Pt[];
  const n = outline.length;
  const validEaves = validEaveEdges(outline);
  const [pitchError, setPitchError] = useState<string | null>(null);
  const [coordError, setCoordError] = useState<string | null>(null);
  const defaultStack = stacks.find((s) => s.id === defaultStackId);
  const sloped = planeResult?.slopedAreaSqFt ?? slopedAreaOf(outline, plane.pitch);
  const id = plane.id;

  const edgeName = (i: number) => `Edge ${i + 1} (corner ${i + 1}→${((i + 1) % n) + 1})`;

  return (
    <section aria-labelledby="plane-inspector-title" className="space-y-4">
      <div className="flex items-start justify-between gap-2">
        <div>
          <h2 id="plane-inspector-title" className="text-sm font-semibold text-steel-900">
            {plane.name || plane.id}
          </h2>
          <p className="text-xs text-steel-600">
            {Math.round(planArea(outline)).toLocaleString("en-US")} sq ft plan · {Math.round(sloped).toLocaleString("en-US")} sq ft sloped ·{" "}
            {(sloped / 100).toFixed(2)} squares
          </p>
        </div>
        {!readOnly && (
          <Button variant="secondary" size="sm" onClick={() => dispatch({ type: "deletePlane", planeId: id })}>
            Delete plane
          </Button>
        )}
      </div>

      <div className="space-y-4 md:grid md:grid-cols-2 md:gap-x-6 md:space-y-0 lg:block lg:space-y-4">
      <div className="space-y-4">
      {readOnly ? (
        <dl className="grid grid-cols-2 gap-x-3 gap-y-1 text-sm">
          <dt className="text-steel-600">Pitch</dt>
          <dd>
            {plane.pitch}/12 ({slopeAngleDeg(plane.pitch).toFixed(1)}°)
          </dd>
          <dt className="text-steel-600">Eave</dt>
          <dd>Edge {plane.eaveEdge + 1}</dd>
          <dt className="text-steel-600">Layer stack</dt>
          <dd>{stackLabel(stacks.find((s) => s.id === plane.stackId) ?? defaultStack ?? { id: "—" })}</dd>
        </dl>
      ) : (
        <div className="grid grid-cols-2 gap-3">
          <Field label="Name" className="col-span-2">
            <CommitInput value={plane.name ?? ""} maxLength={120} onCommit={(t) => dispatch({ type: "rename", planeId: id, name: t.trim() })} />
          </Field>
          <Field
            label="Pitch (rise in 12)"
            error={pitchError ?? undefined}
            hint={pitchError ? undefined : `${slopeAngleDeg(plane.pitch).toFixed(1)}° · ${Math.round((plane.pitch / 12) * 1000) / 10}% slope`}
          >
            <CommitInput
              value={String(plane.pitch)}
              inputMode="decimal"
              parse={numberParse(0, 24, "the rise per 12")}
              onParseError={setPitchError}
              onCommit={(t) => dispatch({ type: "setPitch", planeId: id, pitch: Number(t) })}
            />
          </Field>
          <Field label="Eave edge" hint="The low, level edge the plane rises from">
            <Select value={String(plane.eaveEdge)} onChange={(e) => dispatch({ type: "setEave", planeId: id, edge: Number(e.target.value) })}>
              {outline.map((_, i) => (
                <option key={i} value={i}>
                  {`Edge ${i + 1} · ${feetInches(edgeLength(outline, i))}${validEaves.includes(i) ? "" : " (corners below it)"}`}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Layer stack" className="col-span-2">
            <Select
              value={plane.stackId ?? ""}
              onChange={(e) => dispatch({ type: "setStack", planeId: id, stackId: e.target.value || null })}
            >
              <option value="">Roof default{defaultStack ? ` (${stackLabel(defaultStack)})` : ""}</option>
              {stacks.map((s) => (
                <option key={s.id} value={s.id}>
                  {stackLabel(s)}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Eave height (ft)" hint="Above the lowest eave; for stacked roofs">
            <CommitInput
              value={String(plane.baseElevationFt ?? 0)}
              inputMode="decimal"
              parse={feetParse}
              onCommit={(t) => dispatch({ type: "setPlaneField", planeId: id, field: "baseElevationFt", value: parseFeet(t)! })}
            />
          </Field>
          <Field label="Eave overhang (in)">
            <CommitInput
              value={String(plane.eaveOverhangIn ?? 12)}
              inputMode="decimal"
              parse={numberParse(0, 120, "the overhang")}
              onCommit={(t) => dispatch({ type: "setPlaneField", planeId: id, field: "eaveOverhangIn", value: Number(t) })}
            />
          </Field>
        </div>
      )}

      <div>
        <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-steel-600">Corners (ft)</h3>
        {coordError && <p className="mb-1 text-xs text-danger-700">{coordError}</p>}
        <table className="w-full text-sm">
          <thead>
            <tr className="text-left text-xs text-steel-600">
              <th scope="col" className="w-8 py-1 font-medium">#</th>
              <th scope="col" className="py-1 font-medium">x (east)</th>
              <th scope="col" className="py-1 font-medium">y (north)</th>
              {!readOnly && <th scope="col" className="w-8"><span className="sr-only">Delete</span></th>}
            </tr>
          </thead>
          <tbody>
            {outline.map((p, i) => {
              const active = selection.kind === "vertex" && selection.index === i;
              const setCoord = (axis: 0 | 1) => (t: string) => {
                const v = parseFeet(t)!;
                const next = outline.map((q) => [q[0], q[1]] as Pt);
                next[i][axis] = v;
                dispatch({ type: "setOutline", planeId: id, outline: next });
              };
              return (
                <tr key={i} className={cn(active && "bg-accent-50")}>
                  <td className="py-0.5 pr-1">
                    <button
                      type="button"
                      className="rounded px-1 text-xs text-steel-700 hover:bg-steel-100"
                      aria-label={`Select corner ${i + 1}`}
                      onClick={() => onSelect({ kind: "vertex", planeId: id, index: i })}
                    >
                      {i + 1}
                    </button>
                  </td>
                  {readOnly ? (
                    <>
                      <td>{ftText(p[0])}</td>
                      <td>{ftText(p[1])}</td>
                    </>
                  ) : (
                    <>
                      <td className="py-0.5 pr-1">
                        <CommitInput aria-label={`Corner ${i + 1} x`} value={ftText(p[0])} inputMode="decimal" parse={feetParse} onParseError={setCoordError} onCommit={setCoord(0)} className="h-7" />
                      </td>
                      <td className="py-0.5 pr-1">
                        <CommitInput aria-label={`Corner ${i + 1} y`} value={ftText(p[1])} inputMode="decimal" parse={feetParse} onParseError={setCoordError} onCommit={setCoord(1)} className="h-7" />
                      </td>
                      <td className="py-0.5">
                        <button
                          type="button"
                          disabled={n <= 3}
                          title={n <= 3 ? "A plane needs at least 3 corners" : undefined}
                          aria-label={`Delete corner ${i + 1}`}
                          onClick={() => dispatch({ type: "deleteVertex", planeId: id, index: i })}
                          className="rounded p-1 text-steel-500 hover:bg-steel-100 hover:text-danger-700 disabled:opacity-30"
                        >
                          <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
                            <path d="m4 4 8 8M12 4l-8 8" strokeLinecap="round" />
                          </svg>
                        </button>
                      </td>
                    </>
                  )}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>

      </div>
      <div className="space-y-4">
      <div>
        <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-steel-600">Edges</h3>
        <ul className="divide-y divide-steel-100 rounded-md border border-steel-200">
          {outline.map((_, i) => {
            const info = edgeTypesOf(planeResult, i);
            const active = selection.kind === "edge" && selection.edge === i;
            const style = info.types[0] ? EDGE_STYLES[info.types[0]] : UNTYPED_STYLE;
            return (
              <li key={i}>
                <button
                  type="button"
                  aria-pressed={active}
                  onClick={() => onSelect({ kind: "edge", planeId: id, edge: i })}
                  className={cn("flex w-full items-center gap-2 px-2 py-1 text-left text-sm hover:bg-steel-50", active && "bg-accent-50")}
                >
                  <EdgeSwatch style={style} />
                  <span className="w-12 text-steel-600">Edge {i + 1}</span>
                  <span className="flex-1">
                    {info.types.length ? info.types.map((t) => EDGE_STYLES[t].label).join(" / ") : "—"}
                    {i === plane.eaveEdge && <span className="ml-1 text-xs text-accent-700">(eave edge)</span>}
                  </span>
                  <span className="tabular-nums text-steel-700">{feetInches(info.trueLength ?? edgeLength(outline, i))}</span>
                </button>
                {active && (
                  <EdgeEditor
                    planeId={id}
                    edge={i}
                    label={edgeName(i)}
                    outline={outline}
                    isEave={i === plane.eaveEdge}
                    canBeEave={validEaves.includes(i)}
                    override={(plane.edgeTypes?.[String(i)] as EdgeType | undefined) ?? null}
                    computed={planeResult?.edges.find((e) => e.index === i)?.computedType ?? null}
                    trueLength={info.trueLength}
                    dispatch={dispatch}
                    readOnly={readOnly}
                  />
                )}
              </li>
            );
          })}
        </ul>
      </div>

      <Penetrations plane={plane} dispatch={dispatch} readOnly={readOnly} />
      </div>
      </div>
    </section>
  );
}

function EdgeEditor({
  planeId,
  edge,
  label,
  outline,
  isEave,
  canBeEave,
  override,
  computed,
  trueLength,
  dispatch,
  readOnly,
}: {
  planeId: string;
  edge: number;
  label: string;
  outline: Pt[];
  isEave: boolean;
  canBeEave: boolean;
  override: EdgeType | null;
  computed: EdgeType | null;
  trueLength: number | null;
  dispatch: (i: SketchIntent) => void;
  readOnly: boolean;
}) {
  const [lenError, setLenError] = useState<string | null>(null);
  const plan = edgeLength(outline, edge);
  if (readOnly) {
    return (
      <p className="bg-steel-50 px-2 py-1.5 text-xs text-steel-700">
        {label}: plan {feetInches(plan)}
        {trueLength !== null && ` · true ${feetInches(trueLength)}`}
      </p>
    );
  }
  return (
    <div className="space-y-2 bg-steel-50 px-2 py-2" role="group" aria-label={`${label} settings`}>
      <div className="grid grid-cols-[minmax(0,1fr)_8rem] gap-2">
        <Field label="Edge type">
          <Select
            value={override ?? ""}
            onChange={(e) => dispatch({ type: "setEdgeType", planeId, edge, edgeType: (e.target.value || null) as EdgeType | null })}
          >
            <option value="">Automatic{computed ? ` (${EDGE_STYLES[computed].label.toLowerCase()})` : ""}</option>
            {EDGE_TYPE_LIST.map((t) => (
              <option key={t} value={t}>
                {EDGE_STYLES[t].label}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Plan length" error={lenError ?? undefined} hint={trueLength !== null ? `True length ${feetInches(trueLength)}` : "Moves the edge's end corner"}>
          <CommitInput
            value={feetInches(plan)}
            parse={positiveFeetParse}
            onParseError={setLenError}
            onCommit={(t) => {
              const next = withEdgeLength(outline, edge, parseFeet(t)!);
              if (next) dispatch({ type: "setOutline", planeId, outline: next });
            }}
          />
        </Field>
      </div>
      <div className="flex flex-wrap items-center gap-2">
        {isEave ? (
          <p className="text-xs text-steel-600">This is the plane's eave edge: the plane rises from it.</p>
        ) : (
          <Button size="sm" variant="secondary" onClick={() => dispatch({ type: "setEave", planeId, edge })}>
            Make this the eave edge
          </Button>
        )}
        <Button
          size="sm"
          variant="ghost"
          onClick={() => {
            const a = outline[edge];
            const b = outline[(edge + 1) % outline.length];
            dispatch({ type: "insertVertex", planeId, afterIndex: edge, at: [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2] });
          }}
        >
          Add a corner at its middle
        </Button>
      </div>
      {!isEave && !canBeEave && (
        <p className="text-xs text-caution-700">Some corners lie below this edge's line; the roof will not compute with it as the eave.</p>
      )}
    </div>
  );
}

const KIND_LABEL: Record<(typeof PENETRATION_KINDS)[number], string> = {
  pipe: "Pipe",
  chimney: "Chimney",
  skylight: "Skylight",
  vent: "Vent",
  other: "Other",
};

function penetrationText(p: Penetration): string {
  const parts: string[] = [];
  if (p.diameterIn) parts.push(`${p.diameterIn} in dia.`);
  if (p.widthIn) parts.push(`${p.widthIn} in across`);
  if (p.lengthIn) parts.push(`${p.lengthIn} in up-slope`);
  return `${(p.count ?? 1) > 1 ? `${p.count} × ` : ""}${KIND_LABEL[p.kind ?? "pipe"]}${parts.length ? ` · ${parts.join(", ")}` : ""}`;
}

/** The add-a-penetration form: the shared penetration schema, with the size each kind needs. */
const penetrationFormSchema = penetrationSchema
  .extend({ size: z.number({ error: "Enter a number" }).positive("Must be more than 0"), lengthIn: z.number().positive("Must be more than 0").optional() })
  .omit({ diameterIn: true, widthIn: true, id: true });
type PenetrationForm = z.input<typeof penetrationFormSchema>;
type PenetrationFormOut = z.output<typeof penetrationFormSchema>;

function Penetrations({ plane, dispatch, readOnly }: { plane: DraftPlane; dispatch: (i: SketchIntent) => void; readOnly: boolean }) {
  const list = plane.penetrations ?? [];
  const formId = useId();
  const {
    register,
    handleSubmit,
    watch,
    formState: { errors },
  } = useForm<PenetrationForm, unknown, PenetrationFormOut>({
    resolver: zodResolver(penetrationFormSchema),
    defaultValues: { kind: "pipe", size: 3, count: 1 },
  });
  const kind = watch("kind") ?? "pipe";
  const sizeLabel = kind === "pipe" ? "Diameter (in)" : "Width across slope (in)";
  const optionalNumber = { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? undefined : Number(v)) };

  const add = handleSubmit((v) => {
    const p: Penetration = {
      kind: v.kind,
      count: v.count,
      ...(v.kind === "pipe" ? { diameterIn: v.size } : { widthIn: v.size }),
      ...(v.lengthIn && v.kind !== "pipe" ? { lengthIn: v.lengthIn } : {}),
    };
    dispatch({ type: "addPenetration", planeId: plane.id, penetration: p });
  });

  return (
    <div>
      <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-steel-600">Penetrations</h3>
      {list.length === 0 ? (
        <p className="text-xs text-steel-500">None on this plane.</p>
      ) : (
        <ul className="mb-2 space-y-1" aria-label={`Penetrations on ${plane.name || plane.id}`}>
          {list.map((p, i) => (
            <li key={i} className="flex items-center justify-between gap-2 rounded border border-steel-200 bg-white px-2 py-1 text-sm">
              <span>{penetrationText(p)}</span>
              {!readOnly && (
                <button
                  type="button"
                  className="text-xs text-steel-600 underline hover:text-danger-700"
                  onClick={() => dispatch({ type: "removePenetration", planeId: plane.id, index: i })}
                  aria-label={`Remove ${penetrationText(p)}`}
                >
                  Remove
                </button>
              )}
            </li>
          ))}
        </ul>
      )}
      {!readOnly && (
        <form onSubmit={add} noValidate className="mt-2 grid grid-cols-4 items-start gap-2" aria-labelledby={`${formId}-t`}>
          <span id={`${formId}-t`} className="sr-only">
            Add a penetration
          </span>
          <Field label="Kind" className="col-span-2">
            <Select {...register("kind")}>
              {PENETRATION_KINDS.map((k) => (
                <option key={k} value={k}>
                  {KIND_LABEL[k]}
                </option>
              ))}
            </Select>
          </Field>
          <Field label={sizeLabel} className="col-span-2" error={errors.size?.message}>
            <Input inputMode="decimal" {...register("size", { valueAsNumber: true })} />
          </Field>
          {kind !== "pipe" && (
            <Field label="Up-slope (in)" className="col-span-2" error={errors.lengthIn?.message}>
              <Input inputMode="decimal" placeholder="optional" {...register("lengthIn", optionalNumber)} />
            </Field>
          )}
          <Field label="Count" error={errors.count?.message}>
            <Input inputMode="numeric" {...register("count", { valueAsNumber: true })} />
          </Field>
          <Button type="submit" variant="secondary" size="md" className={cn("mt-5", kind === "pipe" ? "col-span-3" : "")}>
            Add
          </Button>
        </form>
      )}
    </div>
  );
}
