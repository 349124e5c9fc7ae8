import { useState, type ReactNode } from "react";
import type { AttachmentDto } from "@shared/schemas/attachment";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { Spinner } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { errorMessage } from "@/lib/api-client";
import { useMe } from "@/lib/auth";
import { useDeleteAttachment, useUpdateAttachment } from "../api/mutations";
import { useAttachments } from "@/lib/queries/attachments";
import { useUploadQueue } from "../lib/use-upload-queue";
import { ConfirmDelete, DocumentRow, PhotoCard, type AttachmentChange, type ItemPermissions } from "./attachment-items";
import { UploadQueue, UploadZone } from "./upload-zone";

const isImage = (a: AttachmentDto) => a.mime.startsWith("image/");

type Props = {
  jobId: number;
  /**
   * Office-only tools shown below the files, never to crew (the job workspace puts the roof-plane import
   * from a CSV here).
   */
  officeTools?: ReactNode;
};

/**
 * The job's Files: upload (drag and drop, picker, camera), site photos with captions and flags, plan sets
 * and documents, and whatever office tools the screen adds below them. Crew upload and see photos on
 * phone-sized screens.
 */
export function FilesSection({ jobId, officeTools }: Props) {
  const { data: me } = useMe();
  const crew = me?.role === "crew";
  const list = useAttachments(jobId);
  const queue = useUploadQueue(jobId);
  const update = useUpdateAttachment(jobId);
  const remove = useDeleteAttachment(jobId);
  const [toDelete, setToDelete] = useState<AttachmentDto | null>(null);

  const can = (a: AttachmentDto): ItemPermissions => {
    const own = a.uploadedBy?.id === me?.id && a.kind === "photo";
    return crew ? { caption: own, flags: false, delete: own } : { caption: true, flags: true, delete: true };
  };

  const change = (a: AttachmentDto) => (input: AttachmentChange) =>
    update.mutate({ id: a.id, ...input }, { onSuccess: () => "caption" in input && toast.success("Caption saved") });

  const confirmDelete = () => {
    if (!toDelete) return;
    remove.mutate(toDelete.id, {
      onSuccess: () => {
        toast.success(`Deleted "${toDelete.originalName}"`);
        setToDelete(null);
      },
      onError: () => setToDelete(null),
    });
  };

  const photos = (list.data ?? []).filter(isImage);
  const documents = (list.data ?? []).filter((a) => !isImage(a));

  return (
    <div className="space-y-4">
      <UploadZone onFiles={queue.add} photosOnly={crew} />
      <UploadQueue items={queue.items} onCancel={queue.cancel} onDismiss={queue.dismiss} onClear={queue.clearFinished} />

      {list.isPending && <Spinner label="Loading files" />}
      {list.isError && (
        <Alert tone="error" title="The files could not be loaded">
          {errorMessage(list.error)}{" "}
          <Button size="sm" variant="secondary" onClick={() => void list.refetch()}>
            Try again
          </Button>
        </Alert>
      )}

      {list.data && list.data.length === 0 && (
        <EmptyState
          title="No files yet"
          description={crew ? "Photos you take on site appear here for the office." : "Site photos, plan sets, measurement reports and CSV files for this job appear here."}
        />
      )}

      {photos.length > 0 && (
        <section aria-labelledby="photos-title" className="space-y-2">
          <h3 id="photos-title" className="text-sm font-semibold text-steel-900">
            Photos <span className="font-normal text-steel-600">({photos.length})</span>
          </h3>
          <ul className="grid grid-cols-1 gap-3 min-[420px]:grid-cols-2 md:grid-cols-3 xl:grid-cols-4">
            {photos.map((a) => (
              <PhotoCard key={a.id} item={a} can={can(a)} onChange={change(a)} onDelete={() => setToDelete(a)} />
            ))}
          </ul>
        </section>
      )}

      {documents.length > 0 && (
        <section aria-labelledby="documents-title" className="space-y-2">
          <h3 id="documents-title" className="text-sm font-semibold text-steel-900">
            Plans and documents <span className="font-normal text-steel-600">({documents.length})</span>
          </h3>
          <ul className="divide-y divide-steel-100 rounded-lg border border-steel-200 bg-white shadow-panel">
            {documents.map((a) => (
              <DocumentRow key={a.id} item={a} can={can(a)} onChange={change(a)} onDelete={() => setToDelete(a)} />
            ))}
          </ul>
        </section>
      )}

      {!crew && officeTools && <ErrorBoundary>{officeTools}</ErrorBoundary>}

      <ConfirmDelete item={toDelete} busy={remove.isPending} onCancel={() => setToDelete(null)} onConfirm={confirmDelete} />
    </div>
  );
}
