/** The planes as a table: editable name, pitch, stack and eave edge, with the computed areas. */
import { slopeAngleDeg } from "@shared/engine/roof/slope";
import type { TakeoffResult } from "@shared/engine/types";
import { EmptyState } from "@/components/ui/empty-state";
import { Select } from "@/components/ui/select";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import type { DraftPlane, DraftStack } from "@/features/roof/api/roof-draft";
import { cn } from "@/lib/cn";
import { CommitInput } from "./commit-input";
import type { SketchIntent } from "./edits";
import { edgeLength, feetInches, planArea, slopedAreaOf, type Pt } from "./geometry";
import { stackLabel } from "./plane-inspector";

const n0 = (n: number) => Math.round(n).toLocaleString("en-US");
const pitchParse = (t: string) => {
  const v = Number(t.trim());
  return t.trim() !== "" && Number.isFinite(v) && v >= 0 && v <= 24 ? { ok: true as const } : { ok: false as const, error: "Pitch 0 to 24" };
};

export function PlaneTable({
  planes,
  stacks,
  defaultStackId,
  result,
  refusedPlaneId,
  selectedId,
  onSelect,
  dispatch,
  readOnly,
}: {
  planes: DraftPlane[];
  stacks: DraftStack[];
  defaultStackId: string;
  result: TakeoffResult | null;
  refusedPlaneId: string | null;
  selectedId: string | null;
  onSelect: (planeId: string) => void;
  dispatch: (i: SketchIntent) => void;
  readOnly: boolean;
}) {
  if (!planes.length) return <EmptyState title="No roof planes yet" description="Draw a plane or add a quick shape in the drawing view." />;
  const defaultStack = stacks.find((s) => s.id === defaultStackId);
  const byId = new Map(result?.planes.map((p) => [p.id, p]));
  let planSum = 0;
  let slopedSum = 0;
  return (
    <Table aria-label="Roof planes">
      <THead>
        <tr>
          <Th>Name</Th>
          <Th className="w-24">Pitch /12</Th>
          <Th>Angle</Th>
          <Th>Layer stack</Th>
          <Th>Eave edge</Th>
          <Th className="text-right">Plan sq ft</Th>
          <Th className="text-right">Sloped sq ft</Th>
          <Th className="text-right">Squares</Th>
          {!readOnly && (
            <Th>
              <span className="sr-only">Actions</span>
            </Th>
          )}
        </tr>
      </THead>
      <TBody>
        {planes.map((p) => {
          const o = p.outline as Pt[];
          const r = byId.get(p.id);
          const plan = r?.planAreaSqFt ?? planArea(o);
          const sloped = r?.slopedAreaSqFt ?? slopedAreaOf(o, p.pitch);
          planSum += plan;
          slopedSum += sloped;
          const name = p.name || p.id;
          return (
            <Tr key={p.id} className={cn(p.id === selectedId && "bg-accent-50", p.id === refusedPlaneId && "bg-danger-50")}>
              <Td>
                {readOnly ? (
                  name
                ) : (
                  <CommitInput aria-label={`Name of ${name}`} value={p.name ?? ""} onCommit={(t) => dispatch({ type: "rename", planeId: p.id, name: t.trim() })} className="h-7 min-w-32" />
                )}
              </Td>
              <Td>
                {readOnly ? (
                  `${p.pitch}/12`
                ) : (
                  <CommitInput
                    aria-label={`Pitch of ${name}`}
                    value={String(p.pitch)}
                    inputMode="decimal"
                    parse={pitchParse}
                    onCommit={(t) => dispatch({ type: "setPitch", planeId: p.id, pitch: Number(t) })}
                    className="h-7 w-20"
                  />
                )}
              </Td>
              <Td className="tabular-nums text-steel-600">{slopeAngleDeg(p.pitch).toFixed(1)}°</Td>
              <Td>
                {readOnly ? (
                  stackLabel(stacks.find((s) => s.id === p.stackId) ?? defaultStack ?? { id: "—" })
                ) : (
                  <Select aria-label={`Layer stack of ${name}`} value={p.stackId ?? ""} onChange={(e) => dispatch({ type: "setStack", planeId: p.id, stackId: e.target.value || null })} className="min-w-40">
                    <option value="">Roof default{defaultStack ? ` (${stackLabel(defaultStack)})` : ""}</option>
                    {stacks.map((s) => (
                      <option key={s.id} value={s.id}>
                        {stackLabel(s)}
                      </option>
                    ))}
                  </Select>
                )}
              </Td>
              <Td>
                {readOnly ? (
                  `Edge ${p.eaveEdge + 1}`
                ) : (
                  <Select aria-label={`Eave edge of ${name}`} value={String(p.eaveEdge)} onChange={(e) => dispatch({ type: "setEave", planeId: p.id, edge: Number(e.target.value) })} className="min-w-36">
                    {o.map((_, i) => (
                      <option key={i} value={i}>
                        Edge {i + 1} · {feetInches(edgeLength(o, i))}
                      </option>
                    ))}
                  </Select>
                )}
              </Td>
              <Td className="text-right tabular-nums">{n0(plan)}</Td>
              <Td className="text-right tabular-nums">{n0(sloped)}</Td>
              <Td className="text-right tabular-nums">{(sloped / 100).toFixed(2)}</Td>
              {!readOnly && (
                <Td className="whitespace-nowrap text-right">
                  <button type="button" className="text-xs font-medium text-accent-700 underline" onClick={() => onSelect(p.id)}>
                    Show on plan
                  </button>
                </Td>
              )}
            </Tr>
          );
        })}
        <tr className="border-t border-steel-300 bg-steel-50 font-semibold">
          <Td colSpan={5}>Total ({planes.length} planes)</Td>
          <Td className="text-right tabular-nums">{n0(planSum)}</Td>
          <Td className="text-right tabular-nums">{n0(slopedSum)}</Td>
          <Td className="text-right tabular-nums">{(slopedSum / 100).toFixed(2)}</Td>
          {!readOnly && <Td />}
        </tr>
      </TBody>
    </Table>
  );
}
