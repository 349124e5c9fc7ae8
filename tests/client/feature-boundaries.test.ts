/**
 * The client's import boundaries (house style, "Imports"): inside src the flow is
 * `components | lib | config → features → app`, and no feature imports another feature. A screen that needs
 * several features composes them in src/app/routes; what several features need lives in src/lib or src/components.
 *
 * Every .ts/.tsx file under src is read and its import specifiers (`from "…"`, `import("…")`, `import "…"`)
 * are resolved, by the `@/` alias or as a relative path, to the folder they land in.
 */
import { readdirSync, readFileSync } from "node:fs";
import { dirname, join, relative, resolve, sep } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "../..");
const SRC = join(ROOT, "src");

/** Layers that must not know about features or screens. */
const SHARED_LAYERS = ["components", "lib", "config"];

type Import = { file: string; specifier: string; target: string | null };

function listSourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return listSourceFiles(path);
    return /\.tsx?$/.test(entry.name) ? [path] : [];
  });
}

/** Import specifiers in a module's text; whole-line comments (`//`, `/*`, ` * `) are skipped. */
export function importSpecifiers(text: string): string[] {
  const code = text
    .split("\n")
    .filter((line) => !/^\s*(\/\/|\/\*|\*)/.test(line))
    .join("\n");
  const patterns = [
    /\bfrom\s*["']([^"']+)["']/g, // import … from "x", export … from "x"
    /\bimport\s*\(\s*["']([^"']+)["']\s*\)/g, // import("x")
    /^\s*import\s*["']([^"']+)["']/gm, // import "x" (side effects)
  ];
  return patterns.flatMap((re) => [...code.matchAll(re)].map((m) => m[1]!));
}

/** The src-relative path an import lands on (posix separators), or null for packages and other roots. */
export function resolveInSrc(fromFile: string, specifier: string): string | null {
  let abs: string;
  if (specifier.startsWith("@/")) abs = join(SRC, specifier.slice(2));
  else if (specifier === "@") abs = SRC;
  else if (specifier.startsWith(".")) abs = resolve(dirname(fromFile), specifier);
  else return null;
  const rel = relative(SRC, abs);
  if (rel.startsWith("..")) return null; // @shared/, @server/ or outside src
  return rel.split(sep).join("/");
}

const featureOf = (srcPath: string) => /^features\/([^/]+)(\/|$)/.exec(srcPath)?.[1] ?? null;
const layerOf = (srcPath: string) => srcPath.split("/")[0] ?? "";

/** The rule a single import breaks, or null. Paths are src-relative with posix separators. */
export function violation(fromPath: string, targetPath: string): string | null {
  const fromFeature = featureOf(fromPath);
  const toFeature = featureOf(targetPath);
  if (fromFeature && toFeature && fromFeature !== toFeature) return `feature "${fromFeature}" imports feature "${toFeature}"`;
  if (fromFeature && layerOf(targetPath) === "app") return `feature "${fromFeature}" imports the app layer`;
  const fromLayer = layerOf(fromPath);
  if (SHARED_LAYERS.includes(fromLayer) && (layerOf(targetPath) === "features" || layerOf(targetPath) === "app")) {
    return `src/${fromLayer} imports src/${layerOf(targetPath)}`;
  }
  return null;
}

function scan(): { imports: Import[]; offences: string[] } {
  const imports: Import[] = [];
  const offences: string[] = [];
  for (const file of listSourceFiles(SRC)) {
    const fromPath = relative(SRC, file).split(sep).join("/");
    for (const specifier of importSpecifiers(readFileSync(file, "utf8"))) {
      const target = resolveInSrc(file, specifier);
      imports.push({ file: fromPath, specifier, target });
      const broken = target === null ? null : violation(fromPath, target);
      if (broken) offences.push(`src/${fromPath} imports "${specifier}" (${broken})`);
    }
  }
  return { imports, offences };
}

describe("client import boundaries", () => {
  const { imports, offences } = scan();

  it("reads the whole client source", () => {
    const files = new Set(imports.map((i) => i.file));
    expect(files.size).toBeGreaterThan(100);
    // the scan sees aliased, relative and lazy imports, or the checks below would pass vacuously
    expect(imports.some((i) => i.specifier.startsWith("@/features/"))).toBe(true);
    expect(imports.some((i) => i.specifier.startsWith("./") || i.specifier.startsWith("../"))).toBe(true);
    expect(imports.some((i) => i.file === "app/routes/jobs/job-workspace.tsx" && i.target?.startsWith("features/roof/"))).toBe(true);
  });

  it("has no feature importing another feature, no feature importing src/app, and no components/lib/config importing features or app", () => {
    expect(offences, `Imports across the boundaries:\n${offences.join("\n")}`).toEqual([]);
  });
});

describe("the boundary checker itself", () => {
  const file = (p: string) => join(SRC, p);

  it("finds static, re-exported, lazy and side-effect imports, and skips commented ones", () => {
    const text = [
      'import { a } from "@/features/jobs/api/x";',
      'import type { B } from "../b";',
      'export { c } from "./c";',
      'const d = lazy(() => import("@/features/roof/components/d"));',
      'import "./side.css";',
      "// import { e } from \"@/features/quotes/e\";",
      ' * (`import("./pdf-page")`) in a doc comment',
    ].join("\n");
    expect(importSpecifiers(text).sort()).toEqual(["../b", "./c", "./side.css", "@/features/jobs/api/x", "@/features/roof/components/d"]);
  });

  it("resolves aliases and relative paths into src, and leaves packages and other roots out", () => {
    expect(resolveInSrc(file("features/takeoff/components/x.tsx"), "../../roof/api/queries")).toBe("features/roof/api/queries");
    expect(resolveInSrc(file("features/takeoff/components/x.tsx"), "@/features/roof")).toBe("features/roof");
    expect(resolveInSrc(file("lib/x.ts"), "react")).toBeNull();
    expect(resolveInSrc(file("lib/x.ts"), "@shared/schemas/job")).toBeNull();
  });

  it("flags each kind of crossing and allows the permitted directions", () => {
    expect(violation("features/takeoff/components/x.tsx", "features/roof/api/queries")).toMatch(/feature "takeoff" imports feature "roof"/);
    expect(violation("features/roof/x.ts", "app/routes/jobs/job-files")).toMatch(/imports the app layer/);
    expect(violation("lib/queries/roof.ts", "features/roof/api/roof-draft")).toMatch(/src\/lib imports src\/features/);
    expect(violation("components/ui/x.tsx", "app/provider")).toMatch(/src\/components imports src\/app/);
    expect(violation("features/roof/components/x.tsx", "features/roof/api/mutations")).toBeNull();
    expect(violation("features/roof/components/x.tsx", "lib/queries/roof")).toBeNull();
    expect(violation("app/routes/jobs.tsx", "features/customers/components/customer-picker")).toBeNull();
    expect(violation("main.tsx", "app/provider")).toBeNull();
  });
});
