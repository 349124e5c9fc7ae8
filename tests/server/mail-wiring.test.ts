import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadConfig } from "../../server/config";
import { startServer, type RunningServer } from "../../server/index";
import { DEMO_PASSWORD, DEMO_USERS } from "../../server/db/seeders/demo";
import { truncateAll } from "../helpers/db";

// The whole server as `npm start` runs it (catcher in-process, outbox worker polling), on the test database.
// startServer binds the models to its own connection, so this file runs nothing else.
let server: RunningServer;
let cookie = "";

async function call(method: string, path: string, body?: unknown, csrf?: string) {
  const res = await fetch(server.url + path, {
    method,
    headers: { "content-type": "application/json", cookie, ...(csrf ? { "x-csrf-token": csrf } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const set = res.headers.getSetCookie();
  if (set.length) cookie = set.map((c) => c.split(";")[0]).join("; ");
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null };
}

beforeAll(async () => {
  await truncateAll();
  server = await startServer(
    loadConfig({ ...process.env, PORT: "0", HOST: "127.0.0.1", MAIL_CATCHER_PORT: "0", OUTBOX_POLL_MS: "1500" }),
  );
});

afterAll(async () => {
  await server?.close();
});

describe("startServer without SMTP_URL", () => {
  it("runs the catcher and the outbox worker: a reset e-mail shows at /api/dev/mail within 5 s", async () => {
    expect(server.mailCatcher).toBeDefined();
    expect(server.mailCatcher!.port).toBeGreaterThan(0);
    const owner = DEMO_USERS.find((u) => u.role === "owner")!;
    const csrf1 = (await call("GET", "/api/auth/csrf")).body.token as string;
    const started = Date.now();
    expect((await call("POST", "/api/auth/forgot", { email: owner.email }, csrf1)).status).toBe(202);
    const caught = await server.mailCatcher!.waitFor((m) => m.kind === "password_reset", 5_000);
    expect(Date.now() - started).toBeLessThan(5_000);
    expect(caught.to).toEqual([owner.email]);

    const csrf2 = (await call("GET", "/api/auth/csrf")).body.token as string;
    expect((await call("POST", "/api/auth/login", { email: owner.email, password: DEMO_PASSWORD }, csrf2)).status).toBe(200);
    const list = await call("GET", "/api/dev/mail");
    expect(list.status).toBe(200);
    expect(list.body.data.map((m: { subject: string }) => m.subject)).toEqual(["Reset your Ridgewright password"]);
  });
});
