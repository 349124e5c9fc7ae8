import { describe, expect, it } from "vitest";
import { DEFAULT_RULES, gapStudyInputSchema, rulesSchema, takeoffInputSchema } from "@shared/schemas/takeoff";
import { computeTakeoff } from "@shared/engine/takeoff";

const base = () => ({
  planes: [{ id: "a", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]] as number[][], eaveEdge: 0 } as Record<string, unknown>],
  stacks: [{ id: "s" } as Record<string, unknown>],
  defaultStackId: "s",
});

describe("takeoff input defaults", () => {
  it("`{}` parses as rules, with the defaults (common practice values)", () => {
    const r = rulesSchema.parse({});
    expect(r.waste).toEqual({ underlaymentPct: 10, iceBarrierPct: 5, meshPct: 10, dimpledPct: 10, foilPct: 10, battensPct: 10, fastenersPct: 5, deckPct: 10, trimPct: 0 });
    expect(r.underlayment.selfAdhered).toEqual({ rollWidthIn: 36, rollLengthFt: 65, sideLapIn: 3.5, endLapIn: 6 });
    expect(r.underlayment.synthetic).toEqual({ rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 4, endLapIn: 6 });
    expect(r.underlayment.felt30.rollLengthFt).toBe(72);
    expect(r.underlayment.felt15.rollLengthFt).toBe(144);
    expect(r.trim).toEqual({ stockLengthFt: 10, endLapIn: 3, fastenerSpacingIn: 12 });
    expect(r.panels).toMatchObject({ maxLengthFt: 40, longPanelInfoFt: 30 });
    expect(r.clips).toEqual({ spacingIn: { field: 24, edge: 16, corner: 12 }, screwsPerClip: 2 });
    expect(r.exposedFastener.screwsPerSquare).toEqual({ field: 80, edge: 100, corner: 120 });
    expect(r.deck.sheetSqFt).toBe(32);
  });

  it("fills every sub-object and strips unknown keys", () => {
    const v = takeoffInputSchema.parse({ ...base(), extra: 1, site: { nonsense: true } });
    expect(v).not.toHaveProperty("extra");
    expect(v.site).not.toHaveProperty("nonsense");
    expect(v.site).toMatchObject({ atticType: "vented", codeEdition: 2021, ventException: false, wind: { ratedAssemblyRequired: false } });
    expect(v.planes[0]).toMatchObject({ name: "", baseElevationFt: 0, eaveOverhangIn: 12, edgeTypes: {}, penetrations: [] });
    const s = v.stacks[0];
    expect(s.underlayment).toMatchObject({ kind: "synthetic", highTemp: true });
    expect(s.spacer).toMatchObject({ kind: "none", battens: { nominal: "1x4", spacingIn: 24, counterBattens: false } });
    expect(s.panel).toMatchObject({ system: "standing-seam", coverageWidthIn: 16, gauge: 24, lapSealant: false, panelUndersideEmittance: 0.9 });
    expect(s.ventilation).toMatchObject({ eaveOpen: true, topOpen: true });
    expect(v.rules.waste.underlaymentPct).toBe(10);
  });

  it("a takeoff without rules gets every rule at its default, the same values as parsing `{}`, frozen", () => {
    const v = takeoffInputSchema.parse(base());
    expect(v.rules).toBe(DEFAULT_RULES);
    expect(v.rules).toStrictEqual(rulesSchema.parse({}));
    expect(Object.isFrozen(v.rules.waste)).toBe(true);
    expect(() => {
      (v.rules.waste as { trimPct: number }).trimPct = 50;
    }).toThrow(TypeError);
    // Rules that are sent are parsed as sent, their missing fields filled.
    const sent = takeoffInputSchema.parse({ ...base(), rules: { waste: { trimPct: 5 } } });
    expect(sent.rules).not.toBe(DEFAULT_RULES);
    expect(sent.rules.waste).toStrictEqual({ ...rulesSchema.parse({}).waste, trimPct: 5 });
    expect(takeoffInputSchema.safeParse({ ...base(), rules: { waste: { trimPct: -1 } } }).success).toBe(false);
  });

  it("accepts a climate zone like 3A and a code edition as a string", () => {
    const v = takeoffInputSchema.parse({ ...base(), site: { climateZone: "3a", codeEdition: "2018" } });
    expect(v.site.climateZone).toBe("3A");
    expect(v.site.codeEdition).toBe(2018);
  });
});

describe("bad input → field paths (the route answers 400)", () => {
  const planes501 = () => Array.from({ length: 501 }, (_, i) => ({ id: `p${i}`, pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]], eaveEdge: 0 }));
  it.each([
    ["fewer than 3 vertices", (b: ReturnType<typeof base>) => (b.planes[0].outline = [[0, 0], [1, 0]]), "planes.0.outline"],
    ["a self-intersecting outline", (b: ReturnType<typeof base>) => (b.planes[0].outline = [[0, 0], [10, 10], [10, 0], [0, 10]]), "planes.0.outline"],
    ["a zero-area outline", (b: ReturnType<typeof base>) => (b.planes[0].outline = [[0, 0], [5, 0], [10, 0]]), "planes.0.outline"],
    ["pitch 25", (b: ReturnType<typeof base>) => (b.planes[0].pitch = 25), "planes.0.pitch"],
    ["a negative pitch", (b: ReturnType<typeof base>) => (b.planes[0].pitch = -1), "planes.0.pitch"],
    ["an eave index out of range", (b: ReturnType<typeof base>) => (b.planes[0].eaveEdge = 4), "planes.0.eaveEdge"],
    ["a fractional eave index", (b: ReturnType<typeof base>) => (b.planes[0].eaveEdge = 1.5), "planes.0.eaveEdge"],
    ["a vertex below the eave line", (b: ReturnType<typeof base>) => (b.planes[0].outline = [[0, 0], [20, 0], [20, 10], [0, 10], [-2, -3]]), "planes.0.outline.4"],
    ["NaN in a coordinate", (b: ReturnType<typeof base>) => ((b.planes[0].outline as number[][])[1][0] = NaN), "planes.0.outline.1.0"],
    ["Infinity in a coordinate", (b: ReturnType<typeof base>) => ((b.planes[0].outline as number[][])[2][1] = Infinity), "planes.0.outline.2.1"],
    ["a coordinate as a string", (b: ReturnType<typeof base>) => ((b.planes[0].outline as unknown[][])[1][1] = "10"), "planes.0.outline.1.1"],
    ["a coordinate beyond 1,000 ft", (b: ReturnType<typeof base>) => ((b.planes[0].outline as number[][])[2][0] = 1200), "planes.0.outline.2.0"],
    ["a corner with one number", (b: ReturnType<typeof base>) => ((b.planes[0].outline as unknown[])[1] = [20]), "planes.0.outline.1"],
    ["a corner as an object", (b: ReturnType<typeof base>) => ((b.planes[0].outline as unknown[])[3] = { x: 0, y: 10 }), "planes.0.outline.3"],
    ["a negative size", (b: ReturnType<typeof base>) => (b.planes[0].eaveOverhangIn = -1), "planes.0.eaveOverhangIn"],
    ["a negative coverage width", (b: ReturnType<typeof base>) => (b.stacks[0].panel = { coverageWidthIn: -16 }), "stacks.0.panel.coverageWidthIn"],
    ["gauge as a string", (b: ReturnType<typeof base>) => (b.stacks[0].panel = { gauge: "24" }), "stacks.0.panel.gauge"],
    ["an unknown plane stack id", (b: ReturnType<typeof base>) => (b.planes[0].stackId = "nope"), "planes.0.stackId"],
    ["an unknown default stack id", (b: ReturnType<typeof base>) => (b.defaultStackId = "nope"), "defaultStackId"],
    ["an empty id", (b: ReturnType<typeof base>) => (b.planes[0].id = ""), "planes.0.id"],
    ["a duplicate plane id", (b: ReturnType<typeof base>) => b.planes.push({ ...b.planes[0] }), "planes.1.id"],
    ["an edge type for a missing edge", (b: ReturnType<typeof base>) => (b.planes[0].edgeTypes = { "7": "ridge" }), "planes.0.edgeTypes.7"],
    ["a climate zone like 9Z", (b: ReturnType<typeof base>) => ((b as Record<string, unknown>).site = { climateZone: "9Z" }), "site.climateZone"],
    ["501 planes", (b: ReturnType<typeof base>) => (b.planes = planes501()), "planes"],
    // A lap as wide or as long as its roll leaves no coverage per roll (no count, or a division by zero).
    ["an ice-barrier side lap as wide as the roll", (b: ReturnType<typeof base>) => ((b as Record<string, unknown>).rules = { iceBarrier: { rollWidthIn: 36, sideLapIn: 36 } }), "rules.iceBarrier.sideLapIn"],
    ["an ice-barrier end lap as long as the roll", (b: ReturnType<typeof base>) => ((b as Record<string, unknown>).rules = { iceBarrier: { rollLengthFt: 1, endLapIn: 12 } }), "rules.iceBarrier.endLapIn"],
    ["an underlayment side lap wider than the roll", (b: ReturnType<typeof base>) => ((b as Record<string, unknown>).rules = { underlayment: { synthetic: { sideLapIn: 50 } } }), "rules.underlayment.synthetic.sideLapIn"],
    ["a foil end lap longer than the roll", (b: ReturnType<typeof base>) => ((b as Record<string, unknown>).rules = { foil: { rollLengthFt: 2, endLapIn: 30 } }), "rules.foil.endLapIn"],
  ])("%s", (_name, mutate, path) => {
    const b = base();
    mutate(b);
    const res = takeoffInputSchema.safeParse(b);
    expect(res.success).toBe(false);
    if (!res.success) expect(res.error.issues.map((i) => i.path.join("."))).toContain(path);
    const out = computeTakeoff(b);
    expect(out.ok).toBe(false);
    if (!out.ok) {
      expect(out.fields).toHaveProperty([path]);
      expect(out.reason.length).toBeGreaterThan(3);
    }
  });

  it("says what is wrong with a corner, and skips the roof's cross-checks until the corners are whole", () => {
    const issuesOf = (outline: unknown[]) => {
      const b = base();
      b.planes[0].outline = outline as number[][];
      const res = takeoffInputSchema.safeParse(b);
      return res.success ? [] : res.error.issues.map((i) => [i.path.join("."), i.message]);
    };
    expect(issuesOf([[0, 0], [20], [20, 10], [0, 10]])).toEqual([["planes.0.outline.1", "Each corner is a pair of numbers [x, y] in feet"]]);
    expect(issuesOf([[0, 0], [20, 0, 5], [20, 10], [0, 10]])).toEqual([["planes.0.outline.1", "Each corner is a pair of numbers [x, y] in feet"]]);
    expect(issuesOf([[0, 0], [20, "0"], [20, 10], [0, 10]])).toEqual([["planes.0.outline.1.1", "Enter a number"]]);
    expect(issuesOf([[0, 0], [20, 0], [20, 1001], [-1001, 10]])).toEqual([
      ["planes.0.outline.2.1", "At most 1000 ft"],
      ["planes.0.outline.3.0", "At least -1000 ft"],
    ]);
    // A whole, in-range outline still gets the geometric checks (here: it crosses itself).
    expect(issuesOf([[0, 0], [10, 10], [10, 0], [0, 10]])).toEqual([["planes.0.outline", "The outline crosses itself (edges 0 and 2)"]]);
  });

  it("reports each problem once (the geometric checks do not repeat a field's own error)", () => {
    const b = base();
    b.planes[0].outline = [[0, 0], [1, 0]];
    const res = takeoffInputSchema.safeParse(b);
    expect(res.success ? [] : res.error.issues.filter((i) => i.path.join(".") === "planes.0.outline")).toHaveLength(1);
  });
});

describe("gap study input", () => {
  it("needs at least one known plane id", () => {
    expect(gapStudyInputSchema.safeParse({ ...base(), planeIds: [] }).success).toBe(false);
    const res = gapStudyInputSchema.safeParse({ ...base(), planeIds: ["zz"] });
    expect(res.success ? [] : res.error.issues.map((i) => i.path.join("."))).toContain("planeIds.0");
    expect(gapStudyInputSchema.parse({ ...base(), planeIds: ["a"] }).planeIds).toEqual(["a"]);
  });
});
