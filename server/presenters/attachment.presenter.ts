import type { AttachmentDto } from "../../shared/schemas/attachment";
import type { Attachment, User } from "../models/index";

export function presentAttachment(a: Attachment & { uploader?: User | null }): AttachmentDto {
  const v = a.updatedAt.getTime(); // the URLs change when the bytes do (a converted photo), so they can be cached
  return {
    id: a.id,
    jobId: a.jobId,
    kind: a.kind,
    originalName: a.originalName,
    mime: a.mime,
    size: a.size,
    width: a.width ?? null,
    height: a.height ?? null,
    caption: a.caption ?? "",
    showInProposal: Boolean(a.showInProposal),
    forCrew: Boolean(a.forCrew),
    status: a.status,
    error: a.errorMessage ?? null,
    uploadedBy: a.uploader ? { id: a.uploader.id, name: a.uploader.name } : null,
    fileUrl: `/api/attachments/${a.id}/file?v=${v}`,
    thumbUrl: a.thumbKey ? `/api/attachments/${a.id}/thumb?v=${v}` : null,
    createdAt: a.createdAt.toISOString(),
    updatedAt: a.updatedAt.toISOString(),
  };
}
