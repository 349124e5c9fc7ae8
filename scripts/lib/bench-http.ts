/**
 * Signs in over HTTP as a browser would (a CSRF token for the anonymous session, the login, a fresh token
 * for the new session) and returns the headers of a signed-in JSON request. `extra` goes on every request
 * (e.g. `x-forwarded-proto: https` for a server that trusts its proxy).
 */
export async function signInOverHttp(url: string, email: string, password: string, extra: Record<string, string> = {}): Promise<Record<string, string>> {
  let cookie = "";
  const call = async (path: string, init: RequestInit = {}) => {
    const res = await fetch(url + path, { ...init, headers: { "content-type": "application/json", ...extra, cookie, ...((init.headers as Record<string, string>) ?? {}) } });
    const set = res.headers.getSetCookie?.() ?? [];
    if (set.length) cookie = set.map((c) => c.split(";")[0]).join("; ");
    return res;
  };
  const csrf = async () => ((await (await call("/api/auth/csrf")).json()) as { token: string }).token;
  const login = await call("/api/auth/login", { method: "POST", headers: { "x-csrf-token": await csrf() }, body: JSON.stringify({ email, password }) });
  if (login.status !== 200) throw new Error(`sign-in failed: ${login.status} ${await login.text()}`);
  const token = await csrf();
  return { "content-type": "application/json", ...extra, cookie, "x-csrf-token": token };
}

/** The p-th percentile of ascending times (nearest rank). */
export const percentile = (sorted: number[], p: number) =>
  sorted.length ? sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))] : NaN;
