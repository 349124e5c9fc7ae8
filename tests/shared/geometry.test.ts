import { describe, expect, it } from "vitest";
import { isGeometryError, planeGeometry, type PlaneGeometry } from "@shared/engine/roof/geometry";
import { pointInPolygon, polygonArea, selfIntersection, signedArea, stripComponents } from "@shared/engine/roof/polygon";

const ok = (g: ReturnType<typeof planeGeometry>): PlaneGeometry => {
  if (isGeometryError(g)) throw new Error(g.reason);
  return g;
};

describe("polygon helpers", () => {
  it("shoelace area and winding (shoelace formula)", () => {
    expect(signedArea([[0, 0], [4, 0], [4, 3], [0, 3]])).toBe(12);
    expect(signedArea([[0, 0], [0, 3], [4, 3], [4, 0]])).toBe(-12);
    expect(polygonArea([[0, 0], [10, 0], [5, 5]])).toBe(25);
  });

  it("finds self-intersections and accepts simple polygons", () => {
    expect(selfIntersection([[0, 0], [10, 10], [10, 0], [0, 10]])).not.toBeNull();
    expect(selfIntersection([[0, 0], [10, 0], [10, 10], [0, 10]])).toBeNull();
    // an L-shaped (non-convex) outline is simple
    expect(selfIntersection([[0, 0], [20, 0], [20, 10], [10, 10], [10, 20], [0, 20]])).toBeNull();
  });

  it("point in polygon", () => {
    const sq: [number, number][] = [[0, 0], [10, 0], [10, 10], [0, 10]];
    expect(pointInPolygon([5, 5], sq)).toBe(true);
    expect(pointInPolygon([15, 5], sq)).toBe(false);
  });

  it("a notch splits a strip into two pieces", () => {
    // U-shape opening upward: x 0..30, a notch x 10..20 from y 10 to 20
    const u: [number, number][] = [[0, 0], [30, 0], [30, 20], [20, 20], [20, 10], [10, 10], [10, 20], [0, 20]];
    const across = stripComponents(u, 12, 14);
    expect(across).toHaveLength(1);
    expect(across[0].vMax).toBeCloseTo(10, 12);
    const wide = stripComponents(u, 5, 25);
    expect(wide).toHaveLength(1); // connected below the notch
    // a sideways notch: the strip through it meets two separate pieces
    const c: [number, number][] = [[0, 0], [30, 0], [30, 30], [0, 30], [0, 20], [20, 20], [20, 10], [0, 10]];
    const pieces = stripComponents(c, 2, 4);
    expect(pieces).toHaveLength(2);
    expect(pieces.map((p) => [p.vMin, p.vMax])).toEqual([[0, 10], [20, 30]]);
  });
});

describe("plane geometry", () => {
  it("20 × 10 ft plane at 4/12: areas, heights, edge lengths (k = √160/12)", () => {
    const g = ok(planeGeometry({ id: "a", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]], eaveEdge: 0 }, 0));
    const k = Math.sqrt(160) / 12; // rafter table 4/12: 1.0541
    expect(g.planAreaSqFt).toBe(200);
    expect(g.slopedAreaSqFt).toBeCloseTo(200 * k, 10);
    expect(g.squares).toBeCloseTo(2 * k, 10);
    // height = distance from the eave × p/12: 10 ft × 4/12 = 3.333 ft
    expect(g.heights).toEqual([0, 0, 10 / 3, 10 / 3].map((x) => expect.closeTo(x, 10)));
    expect(g.edges[1].planLengthFt).toBe(10);
    expect(g.edges[1].trueLengthFt).toBeCloseTo(10 * k, 10);
    expect(g.edges[0].trueLengthFt).toBe(20);
  });

  it("the interior side comes from the winding, not from the centroid", () => {
    // clockwise outline, eave along the top edge: the plane rises toward −y
    const g = ok(planeGeometry({ id: "a", pitch: 6, outline: [[0, 10], [20, 10], [20, 0], [0, 0]], eaveEdge: 0 }, 0));
    expect(g.winding).toBe("cw");
    expect(g.up[1]).toBeCloseTo(-1, 12);
    expect(g.heights[2]).toBeCloseTo(5, 12); // 10 ft run × 6/12
  });

  it("base elevation lifts every height", () => {
    const g = ok(planeGeometry({ id: "a", pitch: 12, outline: [[0, 0], [10, 0], [10, 4], [0, 4]], eaveEdge: 0, baseElevationFt: 9 }, 0));
    expect(g.heights).toEqual([9, 9, 13, 13].map((x) => expect.closeTo(x, 10)));
  });

  it.each([
    ["fewer than 3 corners", { outline: [[0, 0], [1, 0]] }, ["planes", 3, "outline"]],
    ["self-intersecting", { outline: [[0, 0], [10, 10], [10, 0], [0, 10]] }, ["planes", 3, "outline"]],
    ["zero area", { outline: [[0, 0], [5, 0], [10, 0]] }, ["planes", 3, "outline"]],
    ["pitch out of range", { pitch: 25 }, ["planes", 3, "pitch"]],
    ["eave index out of range", { eaveEdge: 4 }, ["planes", 3, "eaveEdge"]],
    ["vertex below the eave line", { outline: [[0, 0], [20, 0], [20, 10], [0, 10], [-2, -3]] }, ["planes", 3, "outline", 4]],
  ])("refuses %s with the field path", (_name, patch, path) => {
    const g = planeGeometry({ id: "x", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]], eaveEdge: 0, ...(patch as object) }, 3);
    expect(isGeometryError(g)).toBe(true);
    if (isGeometryError(g)) {
      expect(g.path).toEqual(path);
      expect(g.reason.length).toBeGreaterThan(5);
    }
  });

  it("accepts a vertex within 0.01 ft below the eave (the engine's one tolerance)", () => {
    const g = planeGeometry({ id: "x", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10], [-1, -0.005]], eaveEdge: 0 }, 0);
    expect(isGeometryError(g)).toBe(false);
  });
});
