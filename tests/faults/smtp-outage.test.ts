/**
 * Drill: the SMTP server (the local catcher) down for a while under a running server. The e-mails
 * written meanwhile stay in the outbox (pending, with the failure noted), and once SMTP is back each is
 * delivered exactly once: counted at the catcher, not just in the outbox table.
 */
import { afterAll, describe, expect, inject, it } from "vitest";
import { Op } from "sequelize";
import { buildUser } from "../helpers/factories";
import { testSequelize } from "../helpers/db";
import { createMailCatcher, type MailCatcher } from "../../server/mail/catcher";
import { OutboxMessage } from "../../server/models/mail.models";
import { enqueueEmail } from "../../server/services/outbox.service";
import { Client, sleep, waitUntil } from "./helpers/http-client";
import { startServerProcess, type ServerProcess } from "./helpers/server-process";

const db = inject("faultsDb");
let server: ServerProcess | null = null;
const catchers: MailCatcher[] = [];

afterAll(async () => {
  await server?.kill("SIGTERM");
  for (const c of catchers) await c.close();
});

async function catcherOn(port: number): Promise<MailCatcher> {
  const c = createMailCatcher({ port });
  await c.listen();
  catchers.push(c);
  return c;
}

/** How many copies of the message to `to` reached any catcher of this drill. */
const copiesTo = (to: string) => catchers.reduce((n, c) => n + c.messages().filter((m) => m.envelopeTo.includes(to)).length, 0);

describe("the SMTP server down for a while", () => {
  it("keeps the e-mails in the outbox and delivers each exactly once when SMTP is back", async () => {
    const first = await catcherOn(0);
    const port = first.port;
    server = await startServerProcess(db, { SMTP_URL: `smtp://127.0.0.1:${port}`, OUTBOX_POLL_MS: "200" });
    const owner = await buildUser({ role: "owner" });
    const others = [await buildUser({ role: "estimator", companyId: owner.companyId }), await buildUser({ role: "crew", companyId: owner.companyId })];
    const client = new Client(server.url);
    await client.refreshToken();

    // SMTP up: a password-reset e-mail arrives within seconds.
    expect((await client.post("/api/auth/forgot", { email: owner.email })).status).toBe(202);
    await first.waitFor((m) => m.envelopeTo.includes(owner.email), 10_000);

    // SMTP down: two more reset e-mails through the API, five more written straight to the outbox.
    await first.close();
    const lastBefore = (await OutboxMessage.max<number, OutboxMessage>("id")) ?? 0;
    for (const u of others) expect((await client.post("/api/auth/forgot", { email: u.email })).status).toBe(202);
    const direct = Array.from({ length: 5 }, (_, i) => `drill-${i + 1}-${Date.now()}@example.com`);
    await testSequelize().transaction(async (transaction) => {
      for (const to of direct) {
        await enqueueEmail(
          { to, subject: `Fault drill ${to}`, text: "Sent while SMTP was down.", html: "<p>Sent while SMTP was down.</p>" },
          { transaction, companyId: owner.companyId, kind: "fault_drill" },
        );
      }
    });
    const recipients = [...others.map((u) => u.email), ...direct];
    const rows = () => OutboxMessage.findAll({ where: { id: { [Op.gt]: lastBefore } } });

    // The worker tries, fails and keeps every message pending, with the failure noted.
    await waitUntil(
      async () => {
        const r = await rows();
        return r.length === recipients.length && r.every((m) => m.attempts >= 1 && m.status === "pending" && m.lastError) ? true : undefined;
      },
      20_000,
      "every e-mail to have failed once and stayed pending",
    ).catch(async (err) => {
      const r = await OutboxMessage.findAll({ order: [["id", "ASC"]] });
      throw new Error(`${err.message}: ${JSON.stringify(r.map((m) => [m.id, m.kind, m.status, m.attempts, m.lastError, m.createdAt]))}\n${server!.output()}`);
    });
    await sleep(2_000); // down for a while longer
    expect(recipients.map(copiesTo)).toEqual(recipients.map(() => 0));
    expect((await rows()).every((m) => m.status === "pending")).toBe(true);

    // SMTP back on the same port: each pending e-mail is delivered (after the worker's back-off), once.
    await catcherOn(port);
    await waitUntil(async () => ((await rows()).every((m) => m.status === "sent") ? true : undefined), 60_000, "every e-mail to be sent");
    await sleep(2_000); // time for any second copy to show up
    expect(recipients.map(copiesTo)).toEqual(recipients.map(() => 1));
    expect(copiesTo(owner.email)).toBe(1);
    const sent = await rows();
    expect(sent.every((m) => m.attempts >= 2 && m.sentAt !== null)).toBe(true);
    expect(server.exited()).toBe(false);
  });
});
