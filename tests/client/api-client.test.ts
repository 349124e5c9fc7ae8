import { beforeEach, describe, expect, it } from "vitest";
import { api, ApiError, resetCsrfToken } from "@/lib/api-client";
import { shouldRetry } from "@/lib/query-client";
import { json, stubApi } from "./fetch-stub";

beforeEach(() => {
  resetCsrfToken();
});

describe("api()", () => {
  it("GET sends no CSRF token and returns the parsed body", async () => {
    const stub = stubApi({ "GET /api/users": () => json(200, { data: [] }) });
    await expect(api("/users")).resolves.toEqual({ data: [] });
    expect(stub.calls).toHaveLength(1);
    expect(stub.calls[0]!.headers["x-csrf-token"]).toBeUndefined();
    expect(stub.calls[0]!.credentials).toBe("same-origin");
  });

  it("fetches the CSRF token once and reuses it for later writes", async () => {
    const stub = stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "tok-A" }),
      "PATCH /api/users/7": () => json(200, { data: { id: 7 } }),
    });
    await api("/users/7", { method: "PATCH", json: { active: false } });
    await api("/users/7", { method: "PATCH", json: { active: true } });
    expect(stub.callsTo("GET /api/auth/csrf")).toHaveLength(1);
    expect(stub.callsTo("PATCH /api/users/7").map((c) => c.headers["x-csrf-token"])).toEqual(["tok-A", "tok-A"]);
  });

  it("drops the cached token after login and after logout (the session is replaced)", async () => {
    const stub = stubApi({
      "GET /api/auth/csrf": [() => json(200, { token: "before" }), () => json(200, { token: "after-login" }), () => json(200, { token: "after-logout" })],
      "POST /api/auth/login": () => json(200, { user: { id: 1 } }),
      "POST /api/auth/logout": () => json(204),
      "POST /api/auth/password": () => json(204),
    });
    await api("/auth/login", { method: "POST", json: { email: "a@example.com", password: "x" } });
    await api("/auth/password", { method: "POST", json: {} });
    await api("/auth/logout", { method: "POST" });
    await api("/auth/password", { method: "POST", json: {} });

    expect(stub.callsTo("POST /api/auth/login")[0]!.headers["x-csrf-token"]).toBe("before");
    expect(stub.callsTo("POST /api/auth/logout")[0]!.headers["x-csrf-token"]).toBe("after-login");
    expect(stub.callsTo("POST /api/auth/password").map((c) => c.headers["x-csrf-token"])).toEqual([
      "after-login",
      "after-logout",
    ]);
  });

  it("on a 403 with code csrf, fetches a fresh token and retries once", async () => {
    const stub = stubApi({
      "GET /api/auth/csrf": [() => json(200, { token: "stale" }), () => json(200, { token: "fresh" })],
      "POST /api/users": [
        () => json(403, { error: { code: "csrf", message: "Invalid security token" } }),
        () => json(201, { data: { id: 9 } }),
      ],
    });
    await expect(api("/users", { method: "POST", json: {} })).resolves.toEqual({ data: { id: 9 } });
    expect(stub.callsTo("POST /api/users").map((c) => c.headers["x-csrf-token"])).toEqual(["stale", "fresh"]);
  });

  it("retries a CSRF refusal only once", async () => {
    const stub = stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/users": () => json(403, { error: { code: "csrf", message: "Invalid security token" } }),
    });
    await expect(api("/users", { method: "POST", json: {} })).rejects.toMatchObject({ status: 403, code: "csrf" });
    expect(stub.callsTo("POST /api/users")).toHaveLength(2);
  });

  it("does not retry a 403 that is not about CSRF", async () => {
    const stub = stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/users": () => json(403, { error: { code: "forbidden", message: "You don't have access to this" } }),
    });
    await expect(api("/users", { method: "POST", json: {} })).rejects.toMatchObject({ status: 403, code: "forbidden" });
    expect(stub.callsTo("POST /api/users")).toHaveLength(1);
  });

  it("returns undefined for 204", async () => {
    stubApi({ "GET /api/auth/csrf": () => json(200, { token: "t" }), "PUT /api/users/3/password": () => json(204) });
    await expect(api("/users/3/password", { method: "PUT", json: { password: "long-enough-1" } })).resolves.toBeUndefined();
  });

  it("turns the error body into an ApiError with status, code, message and fields", async () => {
    stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "PATCH /api/users/2": () =>
        json(409, { error: { code: "last_owner", message: "The last active owner must stay", fields: { role: "Keep one owner" } } }),
    });
    const err = await api("/users/2", { method: "PATCH", json: { role: "crew" } }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect(err).toMatchObject({ status: 409, code: "last_owner", message: "The last active owner must stay", fields: { role: "Keep one owner" } });
  });

  it("keeps what the server sent beside the error (the current version on a stale save)", async () => {
    stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "t1" }),
      "PUT /api/jobs/3/roof": () => json(409, { error: { code: "stale_version", message: "Someone saved first" }, currentVersion: 7 }),
    });
    const err = await api("/jobs/3/roof", { method: "PUT", json: { version: 6 } }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).details).toEqual({ currentVersion: 7 });
  });

  it("a body that is not JSON still gives an ApiError with the status", async () => {
    stubApi({ "GET /api/users": () => new Response("<html>Bad gateway</html>", { status: 502 }) });
    await expect(api("/users")).rejects.toMatchObject({ status: 502, code: "server_error" });
  });

  it("a network failure becomes ApiError status 0, code network", async () => {
    stubApi({
      "GET /api/users": () => {
        throw new TypeError("fetch failed");
      },
    });
    await expect(api("/users")).rejects.toMatchObject({ status: 0, code: "network" });
  });
});

describe("shouldRetry", () => {
  it.each([
    { label: "a network failure", error: new ApiError(0, "network", "offline"), failures: 0, expected: true },
    { label: "a 503", error: new ApiError(503, "unavailable", "db down"), failures: 1, expected: true },
    // two retries at most
    { label: "a 500 after two failures", error: new ApiError(500, "internal", "oops"), failures: 2, expected: false },
    { label: "a 400", error: new ApiError(400, "bad_request", "bad"), failures: 0, expected: false },
    { label: "a 401", error: new ApiError(401, "unauthorized", "sign in"), failures: 0, expected: false },
    { label: "a 404", error: new ApiError(404, "not_found", "gone"), failures: 0, expected: false },
    { label: "a 409", error: new ApiError(409, "conflict", "stale"), failures: 0, expected: false },
    { label: "an abort", error: new DOMException("aborted", "AbortError"), failures: 0, expected: false },
  ])("$label → retry: $expected", ({ error, failures, expected }) => {
    expect(shouldRetry(failures, error)).toBe(expected);
  });
});
