import { describe, expect, it } from "vitest";
import { slopeFactor } from "@shared/engine/roof/slope";
import { applyIntent } from "@/features/roof/sketch/edits";
import {
  defaultEaveEdge,
  feetInches,
  fitView,
  fromView,
  parseFeet,
  selfCrosses,
  slopedAreaOf,
  snapPoint,
  toView,
  validEaveEdges,
  withEdgeLength,
  zoomAt,
} from "@/features/roof/sketch/geometry";
import type { RoofDoc } from "@/features/roof/api/roof-draft";

describe("sketch geometry", () => {
  it("toView flips y and fromView inverts it", () => {
    const v = { scale: 10, ox: 50, oy: 400 };
    expect(toView(v, [3, 2])).toEqual([80, 380]);
    expect(fromView(v, [80, 380])).toEqual([3, 2]);
  });

  it("zooming keeps the point under the pointer in place", () => {
    const v = { scale: 10, ox: 50, oy: 400 };
    const z = zoomAt(v, 2, [130, 300]);
    expect(z.scale).toBe(20);
    expect(toView(z, fromView(v, [130, 300]))).toEqual([130, 300]);
  });

  it("fitting a box centres it in the viewport", () => {
    const v = fitView({ minX: 0, minY: 0, maxX: 40, maxY: 20 }, 800, 560, 40);
    expect(v.scale).toBe(18); // min((800 − 80)/40, (560 − 80)/20)
    expect(toView(v, [20, 10])).toEqual([400, 280]);
  });

  it("snaps to 1 ft, 6 in and 1 in", () => {
    expect(snapPoint([10.4, -0.6], 1)).toEqual([10, -1]);
    expect(snapPoint([10.3, 7.74], 0.5)).toEqual([10.5, 7.5]);
    expect(snapPoint([10.3, 7.74], 1 / 12)).toEqual([10.333, 7.75]);
  });

  it("writes and reads feet and inches", () => {
    expect(feetInches(23 + 4 / 12)).toBe(`23' 4"`);
    expect(feetInches(11.99)).toBe(`12' 0"`);
    expect(feetInches(0.5)).toBe(`0' 6"`);
    expect(parseFeet(`23' 6"`)).toBe(23.5);
    expect(parseFeet("23'6")).toBe(23.5);
    expect(parseFeet("23 6")).toBe(23.5);
    expect(parseFeet("23.25")).toBe(23.25);
    expect(parseFeet(`6"`)).toBe(0.5);
    expect(parseFeet("12 ft")).toBe(12);
    expect(parseFeet("abc")).toBeNull();
    expect(parseFeet("")).toBeNull();
  });

  it("sloped area is plan area × √(144 + p²)/12", () => {
    // framing-square rafter table: 6/12 → 13.42 in of rafter per 12 in of run (slope factor 1.1180)
    expect(slopedAreaOf([[0, 0], [10, 0], [10, 10], [0, 10]], 6)).toBeCloseTo(111.8, 1);
    expect(slopeFactor(6)).toBeCloseTo(1.118, 3);
  });

  it("offers as eave only edges with every corner on the plane's side", () => {
    const notch: [number, number][] = [[0, 0], [10, 0], [10, 10], [5, 5], [0, 10]];
    expect(validEaveEdges(notch)).toEqual([0, 1, 4]);
    expect(defaultEaveEdge(notch)).toBe(0);
    expect(defaultEaveEdge([[0, 0], [4, 0], [4, 10], [0, 10]])).toBe(1); // the longest
  });

  it("sets an edge's length by moving its end corner along the edge", () => {
    expect(withEdgeLength([[0, 0], [3, 4], [0, 8]], 0, 10)).toEqual([[0, 0], [6, 8], [0, 8]]);
    expect(withEdgeLength([[0, 0], [3, 4], [0, 8]], 2, 4)).toEqual([[0, 4], [3, 4], [0, 8]]);
    expect(withEdgeLength([[0, 0], [3, 4], [0, 8]], 0, 0)).toBeNull();
  });

  it("finds an outline that crosses itself", () => {
    expect(selfCrosses([[0, 0], [10, 10], [10, 0], [0, 10]])).toBe(true);
    expect(selfCrosses([[0, 0], [10, 0], [10, 10], [0, 10]])).toBe(false);
  });
});

describe("sketch edits", () => {
  const doc: RoofDoc = {
    planes: [{ id: "a", name: "A", pitch: 6, outline: [[0, 0], [10, 0], [10, 10], [0, 10]], eaveEdge: 2, edgeTypes: { "3": "sidewall", "1": "rake" } }],
    stacks: [{ id: "s" }],
    defaultStackId: "s",
  };

  it("deleting a corner keeps the eave and the edge overrides on the same edges", () => {
    const next = applyIntent(doc, { type: "deleteVertex", planeId: "a", index: 1 });
    expect(next.planes[0].outline).toEqual([[0, 0], [10, 10], [0, 10]]);
    expect(next.planes[0].eaveEdge).toBe(1); // was edge 2: (10,10)→(0,10)
    expect(next.planes[0].edgeTypes).toEqual({ "2": "sidewall" }); // edge 1 merged away
  });

  it("never leaves a plane with fewer than three corners, and records no change for a no-op", () => {
    const tri: RoofDoc = { ...doc, planes: [{ ...doc.planes[0], outline: [[0, 0], [1, 0], [0, 1]], eaveEdge: 0 }] };
    expect(applyIntent(tri, { type: "deleteVertex", planeId: "a", index: 0 })).toBe(tri);
    expect(applyIntent(doc, { type: "setPitch", planeId: "a", pitch: 6 })).toBe(doc);
  });

  it("moving a shared point moves every listed corner", () => {
    const two: RoofDoc = {
      ...doc,
      planes: [doc.planes[0], { id: "b", pitch: 6, outline: [[10, 0], [20, 0], [20, 10], [10, 10]], eaveEdge: 0 }],
    };
    const next = applyIntent(two, { type: "movePoints", moves: [{ planeId: "a", index: 1 }, { planeId: "b", index: 0 }], to: [11, 0] });
    expect(next.planes[0].outline[1]).toEqual([11, 0]);
    expect(next.planes[1].outline[0]).toEqual([11, 0]);
  });

  it("adding planes to a roof without stacks adds the default stack", () => {
    const empty: RoofDoc = { planes: [], stacks: [], defaultStackId: "" };
    const next = applyIntent(empty, { type: "addPlanes", planes: [{ id: "p", pitch: 4, outline: [[0, 0], [1, 0], [0, 1]], eaveEdge: 0 }] });
    expect(next.stacks.map((s) => s.name)).toEqual(["Main roof"]);
    expect(next.defaultStackId).toBe(next.stacks[0].id);
  });
});
