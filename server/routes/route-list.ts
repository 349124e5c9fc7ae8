/**
 * Lists every route an Express 5 app really mounts, by walking its router stack (the `router` package:
 * a layer is either a route, with `.route.path` and `.route.methods`, or a middleware whose handle may be a
 * sub-router with its own `.stack`; `layer.rawPath` keeps the path the layer was mounted at). Used by the
 * authorization matrix and the bad-input tests so that a new route cannot be left out of them.
 */
import type { Express } from "express";

export interface ListedRoute {
  method: string;
  /** The full path with its params, e.g. `/api/jobs/:jobId/quotes` or `/api/attachments/:id/file`. */
  path: string;
}

interface StackLayer {
  name?: string;
  rawPath?: unknown;
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: StackLayer[] };
}

const join = (base: string, part: string): string => {
  const joined = `${base}/${part}`.replace(/\/{2,}/g, "/");
  return joined.length > 1 ? joined.replace(/\/$/, "") : joined;
};

function pathsOf(raw: unknown, where: string): string[] {
  if (raw === undefined || raw === null) return ["/"]; // app.use(fn) / router.use(fn): mounted at the root
  const list = Array.isArray(raw) ? raw.flat(Infinity) : [raw];
  return list.map((p) => {
    if (typeof p !== "string") throw new Error(`listRoutes: a ${where} is mounted at a non-string path (${String(p)}); list it by hand`);
    return p;
  });
}

function walk(stack: StackLayer[], base: string, out: ListedRoute[]): void {
  for (const layer of stack) {
    if (layer.route) {
      for (const p of pathsOf(layer.route.path, "route")) {
        const methods = Object.keys(layer.route.methods).filter((m) => layer.route!.methods[m] && m !== "_all");
        if (layer.route.methods._all) methods.push("all");
        for (const m of methods) out.push({ method: m.toUpperCase(), path: join(base, p) });
      }
    } else if (layer.handle && Array.isArray(layer.handle.stack)) {
      for (const p of pathsOf(layer.rawPath, "router")) walk(layer.handle.stack, join(base, p), out);
    } else if (layer.name === "mounted_app") {
      // app.use(path, express()) hides the sub-app's router behind a wrapper: refuse rather than skip its routes.
      throw new Error("listRoutes: a sub-app is mounted; mount a Router instead so its routes can be listed");
    }
  }
}

/** Every `METHOD /path` the app answers (HEAD implied by GET is not listed), in mount order, without duplicates. */
export function listRoutes(app: Express): ListedRoute[] {
  const router = (app as unknown as { router?: { stack: StackLayer[] } }).router;
  if (!router) throw new Error("listRoutes: the app has no router (Express 5 creates it on the first app.use/app.get)");
  const out: ListedRoute[] = [];
  walk(router.stack, "", out);
  const seen = new Set<string>();
  return out.filter((r) => {
    const key = `${r.method} ${r.path}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}
