import request from "supertest";
import type { Express } from "express";
import { createTestApp } from "./app";
import { buildUser, TEST_PASSWORD, type UserAttrs } from "./factories";

export async function csrfFor(agent: ReturnType<typeof request.agent>): Promise<string> {
  const res = await agent.get("/api/auth/csrf").expect(200);
  return res.body.token as string;
}

/** A real passport sign-in; the agent keeps the session cookie. */
export async function signedInAgent(overrides: Partial<UserAttrs> = {}, app: Express = createTestApp()) {
  const user = await buildUser(overrides);
  const agent = request.agent(app);
  const csrf1 = await csrfFor(agent);
  await agent
    .post("/api/auth/login")
    .set("X-CSRF-Token", csrf1)
    .send({ email: user.email, password: TEST_PASSWORD })
    .expect(200);
  return { agent, token: await csrfFor(agent), user, app }; // the session was replaced at login
}
