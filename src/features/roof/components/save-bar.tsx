/**
 * The roof draft's save bar, shared by the sections that edit the roof (Roof sketch, Layer stack):
 * what state the draft is in, undo / redo, and Save with the draft's base version. A 409 (someone saved
 * in between) offers to reload their roof or keep editing; other failures keep the draft (it is in this
 * browser's storage) and list the server's field messages.
 */
import { useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import type { RoofDto } from "@shared/schemas/roof";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { toast } from "@/components/ui/toast";
import { api, ApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { useSaveRoof } from "../api/mutations";
import { roofKeys } from "@/lib/queries/roof";
import { roofDraftStore, useRoofDraft } from "../api/roof-draft";

const time = (iso: string | null) =>
  iso ? new Date(iso).toLocaleTimeString(undefined, { hour: "2-digit", minute: "2-digit" }) : "";

export function SaveBar({ jobId, className }: { jobId: number; className?: string }) {
  const draft = useRoofDraft(jobId);
  const save = useSaveRoof(jobId);
  const qc = useQueryClient();
  const [conflict, setConflict] = useState(false);
  const [failure, setFailure] = useState<{ message: string; fields: [string, string][] } | null>(null);
  const [reloading, setReloading] = useState(false);

  if (!draft) return null;

  const onSave = () => {
    setFailure(null);
    save.mutate(undefined, {
      onSuccess: () => {
        setConflict(false);
        toast.success("Roof saved; the takeoff is updated.");
      },
      onError: (e) => {
        if (e instanceof ApiError && e.status === 409) {
          setConflict(true);
          return;
        }
        const fields = e instanceof ApiError && e.fields ? Object.entries(e.fields) : [];
        setFailure({ message: e instanceof Error ? e.message : "The roof could not be saved.", fields });
        toast.error("The roof was not saved. Your changes are kept in this browser.");
      },
    });
  };

  const reload = async () => {
    setReloading(true);
    try {
      const roof = await api<{ data: RoofDto }>(`/jobs/${jobId}/roof`).then((r) => r.data);
      qc.setQueryData(roofKeys.detail(jobId), roof);
      roofDraftStore.replaceWithServer({ ...roof, jobId });
      await qc.invalidateQueries({ queryKey: roofKeys.takeoff(jobId) });
      setConflict(false);
      toast.info("Loaded the roof as it was last saved.");
    } catch {
      toast.error("The saved roof could not be loaded. Try again.");
    } finally {
      setReloading(false);
    }
  };

  return (
    <div className={cn("space-y-2", className)}>
      <div className="flex flex-wrap items-center gap-2 rounded-lg border border-steel-200 bg-white px-3 py-2 shadow-panel" role="group" aria-label="Roof draft">
        <p className="mr-auto text-sm text-steel-700" aria-live="polite">
          {save.isPending ? (
            "Saving…"
          ) : draft.dirty ? (
            <>
              <span className="mr-1.5 inline-block size-2 rounded-full bg-accent-600 align-middle" aria-hidden="true" />
              <span className="font-medium text-steel-900">Unsaved changes</span>
              {draft.changedAt && <span className="text-steel-500"> · last change {time(draft.changedAt)}, kept in this browser</span>}
            </>
          ) : draft.baseVersion > 0 ? (
            <span>Saved · version {draft.baseVersion}</span>
          ) : (
            <span>Not saved yet</span>
          )}
        </p>
        <Button variant="ghost" size="sm" onClick={() => roofDraftStore.undo(jobId)} disabled={!draft.past.length} aria-label="Undo">
          Undo
        </Button>
        <Button variant="ghost" size="sm" onClick={() => roofDraftStore.redo(jobId)} disabled={!draft.future.length} aria-label="Redo">
          Redo
        </Button>
        <Button size="sm" onClick={onSave} loading={save.isPending} disabled={!draft.dirty && draft.baseVersion > 0}>
          Save roof
        </Button>
      </div>
      {conflict && (
        <Alert tone="caution" title="The roof was changed by someone else">
          <p>Someone saved this roof after you started. Reload their roof (your edits here are dropped) or keep editing.</p>
          <div className="mt-2 flex gap-2">
            <Button size="sm" variant="secondary" onClick={reload} loading={reloading}>
              Reload the saved roof
            </Button>
            <Button size="sm" variant="ghost" onClick={() => setConflict(false)}>
              Keep editing
            </Button>
          </div>
        </Alert>
      )}
      {failure && (
        <Alert tone="error" title="The roof was not saved" onDismiss={() => setFailure(null)}>
          <p>{failure.message} Your changes are kept in this browser.</p>
          {failure.fields.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {failure.fields.slice(0, 8).map(([k, m]) => (
                <li key={k}>
                  <span className="font-mono text-xs">{k}</span>: {m}
                </li>
              ))}
            </ul>
          )}
        </Alert>
      )}
    </div>
  );
}
