/** E-mail bodies: every e-mail has a plain-text and an HTML version saying the same thing. */

const HTML_ESCAPES: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" };

/** Escapes text for HTML element content and quoted attribute values. */
export const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => HTML_ESCAPES[c]);

/** A plain, single-column HTML e-mail that renders in common mail clients (inline styles only). */
export function emailLayout(title: string, bodyHtml: string): string {
  return `<!doctype html>
<html lang="en">
<head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>${escapeHtml(title)}</title></head>
<body style="margin:0;padding:24px;background:#f4f5f7;font-family:Inter,Arial,sans-serif;color:#1f2933;line-height:1.5">
<div style="max-width:560px;margin:0 auto;background:#ffffff;border-radius:8px;padding:24px">
${bodyHtml}
</div>
</body>
</html>`;
}

export interface RenderedEmail {
  subject: string;
  text: string;
  html: string;
}

export function passwordResetEmail(input: { name: string; link: string; expiresInMinutes: number }): RenderedEmail {
  const subject = "Reset your Ridgewright password";
  const text = [
    `Hello ${input.name},`,
    "",
    "Someone (hopefully you) asked to reset the password of your Ridgewright account.",
    `Open this link within ${input.expiresInMinutes} minutes to choose a new password:`,
    "",
    input.link,
    "",
    "The link works once. If you did not ask for this, ignore this e-mail: your password stays as it is.",
  ].join("\n");
  const html = emailLayout(
    subject,
    `<p>Hello ${escapeHtml(input.name)},</p>
<p>Someone (hopefully you) asked to reset the password of your Ridgewright account.
Open this link within ${input.expiresInMinutes} minutes to choose a new password:</p>
<p><a href="${escapeHtml(input.link)}" style="display:inline-block;background:#1f4e79;color:#ffffff;padding:10px 18px;border-radius:6px;text-decoration:none">Choose a new password</a></p>
<p style="font-size:13px;color:#52606d">Or copy this address into your browser:<br>${escapeHtml(input.link)}</p>
<p style="font-size:13px;color:#52606d">The link works once. If you did not ask for this, ignore this e-mail: your password stays as it is.</p>`,
  );
  return { subject, text, html };
}

export function passwordChangedEmail(input: { name: string }): RenderedEmail {
  const subject = "Your Ridgewright password was changed";
  const text = [
    `Hello ${input.name},`,
    "",
    "The password of your Ridgewright account was just changed with a reset link, and every other",
    "signed-in device was signed out.",
    "",
    "If this was not you, ask your company's owner to set a new password for you right away.",
  ].join("\n");
  const html = emailLayout(
    subject,
    `<p>Hello ${escapeHtml(input.name)},</p>
<p>The password of your Ridgewright account was just changed with a reset link, and every other signed-in device was signed out.</p>
<p>If this was not you, ask your company's owner to set a new password for you right away.</p>`,
  );
  return { subject, text, html };
}
