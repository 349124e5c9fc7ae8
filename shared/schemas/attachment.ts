/**
 * Files attached to a job: site photos, plan sets, documents and CSV files.
 *
 * POST /api/jobs/:id/attachments (multipart, field `file`, up to UPLOAD_MAX_FILES per request, optional
 * `caption` and `kind: "plan"`) → 201 `{ data: AttachmentDto[] }`. The type comes from the file's content.
 */
import { z } from "zod";

export const ATTACHMENT_KINDS = ["photo", "plan", "document", "csv"] as const;
export type AttachmentKind = (typeof ATTACHMENT_KINDS)[number];
export const ATTACHMENT_STATUSES = ["ready", "processing", "failed"] as const;
export type AttachmentStatus = (typeof ATTACHMENT_STATUSES)[number];

/** Default per-file limit (the server's UPLOAD_MAX_BYTES may change it). */
export const UPLOAD_MAX_BYTES = 25 * 1024 * 1024;
export const UPLOAD_MAX_FILES = 10;
export const CAPTION_MAX = 500;

/** What the file picker offers; the server decides from the content. */
export const UPLOAD_ACCEPT = "image/jpeg,image/png,image/webp,image/heic,image/heif,.heic,.heif,application/pdf,.pdf,text/csv,.csv,text/plain,.txt";

/** Photo types stored as they are (HEIC/HEIF photos are converted to JPEG). */
export const PHOTO_MIMES = ["image/jpeg", "image/png", "image/webp"] as const;

export const attachmentUploadFieldsSchema = z.object({
  caption: z.string().trim().max(CAPTION_MAX, `Use at most ${CAPTION_MAX} characters`).optional(),
  /** "plan" files a PDF or image as a plan (for tracing in the sketch); otherwise the content decides. */
  kind: z.enum(["plan"], { error: 'Only "plan" may be chosen' }).optional(),
});

export const attachmentUpdateSchema = z
  .object({
    caption: z.string().trim().max(CAPTION_MAX, `Use at most ${CAPTION_MAX} characters`).optional(),
    showInProposal: z.boolean({ error: "Use true or false" }).optional(),
    forCrew: z.boolean({ error: "Use true or false" }).optional(),
    /** photo ↔ plan for an image, document ↔ plan for a PDF. */
    kind: z.enum(["photo", "plan", "document"]).optional(),
  })
  .strict();
export type AttachmentUpdate = z.output<typeof attachmentUpdateSchema>;

export const attachmentListQuerySchema = z.object({
  kind: z.enum(ATTACHMENT_KINDS).optional(),
  forCrew: z.enum(["1", "0", "true", "false"]).optional().transform((v) => (v === undefined ? undefined : v === "1" || v === "true")),
});

export interface AttachmentDto {
  id: number;
  jobId: number;
  kind: AttachmentKind;
  /** The file name as uploaded, cleaned for display (never used on disk). */
  originalName: string;
  mime: string;
  size: number;
  width: number | null;
  height: number | null;
  caption: string;
  showInProposal: boolean;
  forCrew: boolean;
  status: AttachmentStatus;
  /** Why processing failed (status "failed"). */
  error: string | null;
  uploadedBy: { id: number; name: string } | null;
  /** `/api/attachments/:id/file`; `thumbUrl` is null without a thumbnail. */
  fileUrl: string;
  thumbUrl: string | null;
  createdAt: string;
  updatedAt: string;
}

/** "2.4 MB", "820 KB". */
export function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${(n / (1024 * 1024)).toFixed(n >= 10 * 1024 * 1024 ? 0 : 1)} MB`;
  if (n >= 1024) return `${Math.round(n / 1024)} KB`;
  return `${n} B`;
}
