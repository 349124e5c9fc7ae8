/**
 * What the local mail catcher keeps per message. No runtime dependencies here, so the routes can use
 * these without loading smtp-server/mailparser (which only the catcher itself needs).
 */

export interface CaughtAttachmentInfo {
  filename: string;
  contentType: string;
  size: number;
}

export interface CaughtMessage {
  id: string;
  messageId: string | null;
  from: string;
  to: string[];
  cc: string[];
  /** RCPT TO addresses as the SMTP client gave them (includes Bcc recipients). */
  envelopeTo: string[];
  subject: string;
  text: string;
  html: string | null;
  /** When the catcher received it (ISO). */
  date: string;
  attachments: CaughtAttachmentInfo[];
  /** From the X-Ridgewright-Company / X-Ridgewright-Kind headers the outbox adds in catcher mode. */
  companyId: number | null;
  kind: string | null;
}

export const CAUGHT_ID_PATTERN = /^\d{13}-[0-9a-f]{8}$/;
export const isCaughtMessageId = (id: string) => CAUGHT_ID_PATTERN.test(id);
