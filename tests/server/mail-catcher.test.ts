import { afterEach, describe, expect, it } from "vitest";
import { randomBytes } from "node:crypto";
import { mkdtemp, readdir, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { startMailCatcher, type MailCatcher } from "../../server/mail/catcher";
import { createSmtpMailer, type Mailer } from "../../server/mail/mailer";

const open: Array<{ catcher: MailCatcher; mailer: Mailer }> = [];
const dirs: string[] = [];

async function setup(options: Parameters<typeof startMailCatcher>[0] = {}) {
  const catcher = await startMailCatcher({ port: 0, ...options });
  const mailer = createSmtpMailer({ host: "127.0.0.1", port: catcher.port }, { from: "Ridgewright <no-reply@example.com>" });
  open.push({ catcher, mailer });
  return { catcher, mailer };
}

afterEach(async () => {
  for (const { catcher, mailer } of open.splice(0)) {
    mailer.close?.();
    await catcher.close();
  }
  for (const d of dirs.splice(0)) await rm(d, { recursive: true, force: true });
});

const pdfLike = () => Buffer.concat([Buffer.from("%PDF-1.7\n"), randomBytes(200_000), Buffer.from([0, 255, 13, 10, 0])]);

describe("local mail catcher", () => {
  it("listens on 127.0.0.1 on a free port when asked for port 0", async () => {
    const { catcher } = await setup();
    expect(catcher.port).toBeGreaterThan(0);
    expect(catcher.host).toBe("127.0.0.1");
  });

  it("receives a message sent with nodemailer: addresses, subject, both bodies, byte-identical attachment", async () => {
    const { catcher, mailer } = await setup();
    const pdf = pdfLike();
    const { messageId } = await mailer.send({
      to: ["Ana Ferreira <ana.ferreira@example.com>", "office@example.com"],
      cc: "copy@example.com",
      bcc: "hidden@example.com",
      subject: "Your roof proposal — Łódź ✓",
      text: "Hello Ana,\nyour proposal is attached.",
      html: "<p>Hello Ana,<br>your proposal is <b>attached</b>.</p>",
      attachments: [{ filename: "proposal 12.pdf", contentType: "application/pdf", content: pdf }],
    });
    const msg = await catcher.waitFor((m) => m.messageId === messageId, 3_000);
    expect(msg).toMatchObject({
      from: "no-reply@example.com",
      to: ["ana.ferreira@example.com", "office@example.com"],
      cc: ["copy@example.com"],
      subject: "Your roof proposal — Łódź ✓",
      text: "Hello Ana,\nyour proposal is attached.",
      attachments: [{ filename: "proposal 12.pdf", contentType: "application/pdf", size: pdf.length }],
    });
    expect(msg.envelopeTo.sort()).toEqual(
      ["ana.ferreira@example.com", "copy@example.com", "hidden@example.com", "office@example.com"].sort(),
    );
    expect(msg.html).toContain("<b>attached</b>");
    expect(msg.id).toMatch(/^\d{13}-[0-9a-f]{8}$/);
    expect(Number.isNaN(Date.parse(msg.date))).toBe(false);
    const att = await catcher.attachment(msg.id, 0);
    expect(att!.content.equals(pdf)).toBe(true);
    expect(await catcher.attachment(msg.id, 1)).toBeUndefined();
    expect(catcher.get(msg.id)).toEqual(msg);
    expect(catcher.get("0000000000000-00000000")).toBeUndefined();
  });

  it("lists messages newest first and drops the oldest beyond maxMessages", async () => {
    const { catcher, mailer } = await setup({ maxMessages: 2 });
    for (const n of [1, 2, 3]) {
      await mailer.send({ to: "a@example.com", subject: `Message ${n}`, text: `n=${n}`, html: `<p>${n}</p>` });
    }
    expect(catcher.messages().map((m) => m.subject)).toEqual(["Message 3", "Message 2"]);
    await catcher.clear();
    expect(catcher.messages()).toEqual([]);
  });

  it("reads the company and kind tags the outbox adds in catcher mode", async () => {
    const { catcher, mailer } = await setup();
    await mailer.send({
      to: "a@example.com",
      subject: "Tagged",
      text: "t",
      html: "<p>t</p>",
      headers: { "X-Ridgewright-Company": "42", "X-Ridgewright-Kind": "password_reset" },
    });
    await mailer.send({ to: "a@example.com", subject: "Untagged", text: "t", html: "<p>t</p>" });
    const [untagged, tagged] = catcher.messages();
    expect(tagged).toMatchObject({ subject: "Tagged", companyId: 42, kind: "password_reset" });
    expect(untagged).toMatchObject({ subject: "Untagged", companyId: null, kind: null });
  });

  it("keeps the inbox on disk: a new catcher on the same folder shows the messages and attachments", async () => {
    const dir = await mkdtemp(path.join(tmpdir(), "rw-mail-"));
    dirs.push(dir);
    const first = await setup({ dir });
    const bytes = pdfLike();
    await first.mailer.send({
      to: "a@example.com",
      subject: "Survives a restart",
      text: "t",
      html: "<p>t</p>",
      attachments: [{ filename: "p.pdf", contentType: "application/pdf", content: bytes }],
    });
    const before = first.catcher.messages();
    first.mailer.close?.();
    await first.catcher.close();
    expect((await readdir(dir)).filter((n) => !n.startsWith("."))).toEqual([before[0].id]);

    const second = await setup({ dir });
    expect(second.catcher.messages()).toEqual(before);
    const att = await second.catcher.attachment(before[0].id, 0);
    expect(att!.content.equals(bytes)).toBe(true);
    await second.catcher.clear();
    expect(await readdir(dir)).toEqual([]);
  });

  it("refuses a message over its size limit and keeps nothing", async () => {
    const { catcher, mailer } = await setup({ maxMessageBytes: 50_000 });
    await expect(
      mailer.send({
        to: "a@example.com",
        subject: "Too big",
        text: "t",
        html: "<p>t</p>",
        attachments: [{ filename: "big.bin", contentType: "application/octet-stream", content: randomBytes(100_000) }],
      }),
    ).rejects.toThrow();
    expect(catcher.messages()).toEqual([]);
  });

  it("waitFor rejects when nothing arrives in time", async () => {
    const { catcher } = await setup();
    await expect(catcher.waitFor(() => true, 100)).rejects.toThrow(/within 100 ms/);
  });
});
