/**
 * Decides what an uploaded file is from its bytes (file-type's magic numbers), never from its name or
 * the browser's claim. Allowed: JPEG, PNG and WebP photos, HEIC/HEIF photos (converted to JPEG later),
 * PDF, and plain text / CSV (no magic number: valid UTF-8 without control characters or markup).
 */
import { fileTypeFromBuffer } from "file-type";
import { HttpError } from "../errors";
import type { AttachmentKind } from "../../shared/schemas/attachment";

export interface Sniffed {
  kind: Exclude<AttachmentKind, "plan">;
  mime: string;
  /** Needs converting to JPEG before it is ready. */
  heic: boolean;
}

const ALLOWED_TEXT = "Upload JPEG, PNG, WebP or HEIC photos, PDF files, or CSV/plain-text files";

export const unsupported = (message: string) => new HttpError(415, "unsupported_type", message);

const PHOTOS: Record<string, true> = { "image/jpeg": true, "image/png": true, "image/webp": true };
const HEIC: Record<string, true> = { "image/heic": true, "image/heif": true, "image/heic-sequence": true, "image/heif-sequence": true };
/** Extensions that promise a binary type; text content under one of these names is refused. */
const BINARY_EXT = /\.(jpe?g|png|webp|gif|heic|heif|pdf|bmp|tiff?|svg|ico|avif)$/i;

/** Valid UTF-8 text with no NUL or other control characters (tab, CR, LF, form feed allowed). */
function isPlainText(buf: Buffer): boolean {
  if (buf.length === 0) return false;
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(buf);
  } catch {
    return false;
  }
  // eslint-disable-next-line no-control-regex
  return !/[\u0000-\u0008\u000b\u000e-\u001f\u007f]/.test(text);
}

/** Text that a browser could take for markup (HTML, SVG, XML): refused even as plain text. */
function looksLikeMarkup(buf: Buffer): boolean {
  const head = buf.subarray(0, 1024).toString("utf8").replace(/^\uFEFF/, "").trimStart().toLowerCase();
  return head.startsWith("<") || /<(script|html|svg|iframe|body|!doctype)\b/.test(head);
}

export async function sniffUpload(buf: Buffer, displayName: string): Promise<Sniffed> {
  if (buf.length === 0) throw unsupported(`"${displayName}" is empty`);
  const found = await fileTypeFromBuffer(buf);
  if (found) {
    if (PHOTOS[found.mime]) return { kind: "photo", mime: found.mime, heic: false };
    if (HEIC[found.mime]) return { kind: "photo", mime: "image/heic", heic: true };
    if (found.mime === "application/pdf") return { kind: "document", mime: "application/pdf", heic: false };
    throw unsupported(`"${displayName}" is a ${found.ext.toUpperCase()} file (${found.mime}), which can't be attached. ${ALLOWED_TEXT}.`);
  }
  if (!isPlainText(buf)) {
    throw unsupported(`The content of "${displayName}" is not a type that can be attached. ${ALLOWED_TEXT}.`);
  }
  if (looksLikeMarkup(buf)) {
    throw unsupported(`"${displayName}" contains HTML or other markup, which can't be attached. ${ALLOWED_TEXT}.`);
  }
  if (BINARY_EXT.test(displayName)) {
    const ext = displayName.slice(displayName.lastIndexOf(".")).toLowerCase();
    throw unsupported(`"${displayName}" is named ${ext} but contains text. ${ALLOWED_TEXT}.`);
  }
  return /\.(csv|tsv)$/i.test(displayName)
    ? { kind: "csv", mime: "text/csv", heic: false }
    : { kind: "document", mime: "text/plain", heic: false };
}

/**
 * The upload's name made safe for display: the last path segment only, no control or reserved
 * characters, at most 200 characters; "file" when nothing is left. Never used as a path.
 */
export function sanitiseFileName(raw: string): string {
  const base = raw.normalize("NFC").split(/[/\\]/).pop() ?? "";
  const cleaned = base
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u001f\u007f-\u009f<>:"|?*]/g, "")
    .replace(/\s+/g, " ")
    .replace(/^[\s.]+|[\s.]+$/g, "")
    .trim();
  if (!cleaned) return "file";
  if (cleaned.length <= 200) return cleaned;
  const dot = cleaned.lastIndexOf(".");
  const ext = dot > 0 && cleaned.length - dot <= 10 ? cleaned.slice(dot) : "";
  return cleaned.slice(0, 200 - ext.length) + ext;
}

/** `Content-Disposition` with an ASCII fallback and the RFC 5987 `filename*` for the real name. */
export function contentDisposition(type: "inline" | "attachment", name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, "_").replace(/["\\%;]/g, "_") || "file";
  const encoded = encodeURIComponent(name).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `${type}; filename="${ascii}"; filename*=UTF-8''${encoded}`;
}
