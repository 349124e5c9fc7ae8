import { useEffect, useRef, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { LoadFailed } from "@/components/ui/load-failed";
import { Spinner } from "@/components/ui/spinner";
import { useMe } from "@/lib/auth";
import { useRoof } from "@/lib/queries/roof";
import { roofDraftStore, useRoofDraft, type RoofDoc } from "@/features/roof/api/roof-draft";
import { SketchEditor } from "@/features/roof/sketch/sketch-editor";

/** Unsaved edits made on an older version, kept until the user resumes or discards them. */
interface StaleDraft {
  doc: RoofDoc;
  changedAt: string | null;
  /** True when the draft in use is itself the stale one (it still builds on the older version). */
  inUse: boolean;
}

const staleKey = (jobId: number) => `ridgewright:roof-draft-set-aside:${jobId}`;

function readSetAside(jobId: number): StaleDraft | null {
  try {
    const raw = localStorage.getItem(staleKey(jobId));
    if (!raw) return null;
    const v = JSON.parse(raw) as { doc?: RoofDoc; changedAt?: string | null };
    return v.doc && Array.isArray(v.doc.planes) ? { doc: v.doc, changedAt: v.changedAt ?? null, inUse: false } : null;
  } catch {
    return null;
  }
}

function writeSetAside(jobId: number, s: StaleDraft | null) {
  try {
    if (s) localStorage.setItem(staleKey(jobId), JSON.stringify({ doc: s.doc, changedAt: s.changedAt }));
    else localStorage.removeItem(staleKey(jobId));
  } catch {
    // storage unavailable: the choice is still offered for this visit
  }
}

/** The job workspace's Roof sketch section: loads the roof into the shared draft and opens the editor. */
export function RoofSketchSection({ jobId }: { jobId: number }) {
  const me = useMe();
  const roof = useRoof(jobId);
  const draft = useRoofDraft(jobId);
  const [stale, setStale] = useState<StaleDraft | null>(() => readSetAside(jobId));
  const loadedVersion = useRef<number | null>(null);

  useEffect(() => {
    if (!roof.data) return;
    const r = roofDraftStore.load({ ...roof.data, jobId });
    if (r.stale && loadedVersion.current !== roof.data.version) {
      const inUse = (roofDraftStore.get(jobId)?.baseVersion ?? roof.data.version) !== roof.data.version;
      const s: StaleDraft = { doc: r.stale.doc, changedAt: r.stale.changedAt, inUse };
      // the store dropped it from storage when it loaded the newer roof: keep it until the user decides
      if (!inUse) writeSetAside(jobId, s);
      setStale(s);
    }
    loadedVersion.current = roof.data.version;
  }, [roof.data, jobId]);

  const resume = () => {
    if (!stale || !roof.data) return;
    if (stale.inUse) roofDraftStore.rebase(jobId, roof.data.version);
    else roofDraftStore.update(jobId, () => stale.doc);
    writeSetAside(jobId, null);
    setStale(null);
  };
  const discard = () => {
    if (stale?.inUse && roof.data) roofDraftStore.replaceWithServer({ ...roof.data, jobId });
    writeSetAside(jobId, null);
    setStale(null);
  };

  if (roof.isError)
    return (
      <LoadFailed title="The roof could not be loaded" error={roof.error} onRetry={() => roof.refetch()} />
    );
  if (!roof.data || !draft || !me.data) return <Spinner label="Loading the roof" />;

  const role = me.data.role;
  const readOnly = role === "crew";
  return (
    <div className="space-y-3">
      {stale && !readOnly && (
        <Alert tone="caution" title="Your unsaved changes are on an older version of this roof">
          <p>
            The changes {stale.changedAt ? `from ${new Date(stale.changedAt).toLocaleString()} ` : ""}were made before someone else saved this roof.
            Resuming puts your changes back; saving them then replaces the newer version.
          </p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button size="sm" variant="secondary" onClick={resume}>
              Resume my unsaved changes
            </Button>
            <Button size="sm" variant="secondary" onClick={discard}>
              Discard them
            </Button>
          </div>
        </Alert>
      )}
      <ErrorBoundary>
        <SketchEditor jobId={jobId} draft={draft} readOnly={readOnly} canReadRules={role === "owner" || role === "estimator"} />
      </ErrorBoundary>
    </div>
  );
}
