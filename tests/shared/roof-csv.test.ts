import { describe, expect, it } from "vitest";
import { parseCsvRecords, parseOutline, parsePitch, parseRoofCsv, roofToCsv, ROOF_CSV_COLUMNS } from "@shared/roof-csv";
import { gableRoof, hipRoof } from "@shared/engine/roof/generators";
import { planeGeometry, isGeometryError } from "@shared/engine/roof/geometry";

const HEADER = ROOF_CSV_COLUMNS.join(",");
const csv = (...rows: string[]) => [HEADER, ...rows].join("\n") + "\n";

/** Plan area of an outline (shoelace). */
const planArea = (pts: [number, number][]) =>
  Math.abs(pts.reduce((s, [x, y], i) => { const [nx, ny] = pts[(i + 1) % pts.length]!; return s + x * ny - nx * y; }, 0)) / 2;

describe("parsePitch", () => {
  it.each([
    ["6", 6],
    ["6/12", 6],
    [" 4.5 / 12 ", 4.5],
    ["12:12", 12],
    ["0", 0],
  ])("reads %j as %d", (raw, want) => expect(parsePitch(raw)).toBe(want));
  it.each(["six", "6/10", "", "6/12/12"])("refuses %j", (raw) => expect(parsePitch(raw)).toBeNull());
});

describe("parseOutline", () => {
  it("reads corners separated by semicolons, x and y by a space or comma", () => {
    expect(parseOutline("0 0; 10 0; 10,5; 0 5")).toEqual([[0, 0], [10, 0], [10, 5], [0, 5]]);
  });
  it("names the corner that is not two numbers", () => {
    expect(parseOutline("0 0; 10; 10 5")).toMatch(/Corner 2/);
  });
  it("needs three corners", () => {
    expect(parseOutline("0 0; 10 0")).toMatch(/at least 3 corners/);
  });
});

describe("parseCsvRecords", () => {
  it("keeps quoted commas, quotes and line breaks in a cell and reports the start line of each record", () => {
    const { records, lines } = parseCsvRecords('a,b\r\n"x, ""y""","two\nlines"\r\nlast,1');
    expect(records).toEqual([["a", "b"], ['x, "y"', "two\nlines"], ["last", "1"]]);
    expect(lines).toEqual([1, 2, 4]);
  });
  it("reports a quote that is never closed", () => {
    expect(parseCsvRecords('a\n"open').error?.message).toMatch(/never closed/);
  });
});

describe("parseRoofCsv: shapes", () => {
  it("places a rectangle at (x, y) with its eave along the bottom (edge 0)", () => {
    const r = parseRoofCsv(csv("South,6/12,rectangle,10,5,40,15,,,,,"));
    expect(r.errors).toEqual([]);
    expect(r.planes[0]).toMatchObject({ name: "South", pitch: 6, eaveEdge: 0, outline: [[10, 5], [50, 5], [50, 20], [10, 20]] });
    expect(r.rows).toEqual([2]);
  });

  it("makes a triangle (hip end) with the apex centred at the depth", () => {
    const r = parseRoofCsv(csv("East end,8,triangle,0,0,30,15,,,,,"));
    expect(r.errors).toEqual([]);
    expect(r.planes[0]!.outline).toEqual([[0, 0], [30, 0], [15, 15]]);
    expect(planArea(r.planes[0]!.outline)).toBeCloseTo(225, 6); // ½ × 30 × 15 (triangle area)
  });

  it("makes a trapezoid with the top width centred over the eave", () => {
    const r = parseRoofCsv(csv("South,6,trapezoid,0,0,40,15,10,,,,"));
    expect(r.errors).toEqual([]);
    expect(r.planes[0]!.outline).toEqual([[0, 0], [40, 0], [25, 15], [15, 15]]);
    expect(planArea(r.planes[0]!.outline)).toBeCloseTo(375, 6); // (40 + 10) / 2 × 15 (trapezoid area)
  });

  it("rotates about (x, y) anticlockwise", () => {
    const r = parseRoofCsv(csv("West,6,rectangle,0,0,20,10,,90,,,"));
    expect(r.errors).toEqual([]);
    expect(r.planes[0]!.outline).toEqual([[0, 0], [0, 20], [-10, 20], [-10, 0]]);
  });

  it("reads an outline and an eave edge", () => {
    const r = parseRoofCsv(csv('Porch,2,outline,,,,,,,"0 8; 0 0; 12 0; 12 8",1,'));
    expect(r.errors).toEqual([]);
    expect(r.planes[0]).toMatchObject({ outline: [[0, 8], [0, 0], [12, 0], [12, 8]], eaveEdge: 1 });
  });

  it("gives new ids that avoid the roof's ids and sets the stack", () => {
    const r = parseRoofCsv(csv("A,6,rectangle,0,0,10,10,,,,,porch", "B,6,rectangle,20,0,10,10,,,,,"), {
      existingIds: ["csv-1"],
      stackIds: ["main", "porch"],
    });
    expect(r.errors).toEqual([]);
    expect(r.planes.map((p) => p.id)).toEqual(["csv-2", "csv-3"]);
    expect(r.planes[0]!.stackId).toBe("porch");
    expect(r.planes[1]!.stackId).toBeUndefined();
  });

  it("accepts a byte-order mark, Windows line ends, blank lines, column names in any case and order", () => {
    const text = "\uFEFFShape,Name,Pitch,Width,Depth\r\n\r\nrectangle,Shed,3/12,12,8\r\n";
    const r = parseRoofCsv(text);
    expect(r.errors).toEqual([]);
    expect(r.planes[0]).toMatchObject({ name: "Shed", pitch: 3, outline: [[0, 0], [12, 0], [12, 8], [0, 8]] });
    expect(r.rows).toEqual([3]);
  });
});

describe("parseRoofCsv: errors by row and column", () => {
  const errorsOf = (row: string, opts = {}) => parseRoofCsv(csv(row), opts).errors;

  it.each([
    ["bad pitch", "A,steep,rectangle,0,0,10,10,,,,,", "pitch", /not a pitch/],
    ["pitch over 24", "A,30,rectangle,0,0,10,10,,,,,", "pitch", /at most 24/],
    ["missing pitch", "A,,rectangle,0,0,10,10,,,,,", "pitch", /Required/],
    ["unknown shape", "A,6,circle,0,0,10,10,,,,,", "shape", /not a shape/],
    ["missing width", "A,6,rectangle,0,0,,10,,,,,", "width", /Required/],
    ["zero depth", "A,6,rectangle,0,0,10,0,,,,,", "depth", /more than 0/],
    ["text for a number", "A,6,rectangle,zero,0,10,10,,,,,", "x", /not a number/],
    ["trapezoid without a top width", "A,6,trapezoid,0,0,10,10,,,,,", "top_width", /Required/],
    ["trapezoid top as wide as the eave", "A,6,trapezoid,0,0,10,10,10,,,,", "top_width", /less than the width/],
    ["top width on a rectangle", "A,6,rectangle,0,0,10,10,4,,,,", "top_width", /leave it blank/],
    ["outline on a rectangle", 'A,6,rectangle,0,0,10,10,,,"0 0; 1 0; 1 1",,', "outline", /leave it blank/],
    ["sizes on an outline", 'A,6,outline,,,10,,,,"0 0; 10 0; 10 10",,', "width", /leave it blank/],
    ["bad outline corner", 'A,6,outline,,,,,,,"0 0; ten 0; 10 10",,', "outline", /Corner 2/],
    ["two-corner outline", 'A,6,outline,,,,,,,"0 0; 10 0",,', "outline", /at least 3 corners/],
    ["outline on one line", 'A,6,outline,,,,,,,"0 0; 5 0; 10 0",,', "outline", /no area/],
    ["self-crossing outline", 'A,6,outline,,,,,,,"0 0; 10 10; 10 0; 0 10",,', "outline", /./],
    ["eave edge out of range", "A,6,triangle,0,0,10,10,,,,3,", "eave_edge", /from 0 to 2/],
    ["eave edge not a number", "A,6,triangle,0,0,10,10,,,,top,", "eave_edge", /not an edge number/],
    ["name too long", `${"N".repeat(121)},6,rectangle,0,0,10,10,,,,,`, "name", /./],
  ])("%s", (_label, row, column, message) => {
    const errors = errorsOf(row);
    expect(errors.length).toBeGreaterThan(0);
    expect(errors).toContainEqual({ row: 2, column, message: expect.stringMatching(message) });
  });

  it("unknown stack names the roof's stacks", () => {
    expect(errorsOf("A,6,rectangle,0,0,10,10,,,,,porch", { stackIds: ["main"] })).toEqual([
      { row: 2, column: "stack", message: 'Unknown layer stack "porch" (this roof has "main")' },
    ]);
  });

  it("a row with extra cells", () => {
    expect(errorsOf("A,6,rectangle,0,0,10,10,,,,,,extra")).toEqual([
      { row: 2, column: "row", message: "This row has 13 cells but the header has 12 columns" },
    ]);
  });

  it("reports every bad row and keeps the good ones with their row numbers", () => {
    const r = parseRoofCsv(csv("Good,6,rectangle,0,0,10,10,,,,,", "Bad,x,rectangle,0,0,10,10,,,,,", "", "Good 2,6,triangle,0,0,10,5,,,,,"));
    expect(r.planes.map((p) => p.name)).toEqual(["Good", "Good 2"]);
    expect(r.rows).toEqual([2, 5]);
    expect(r.errors).toEqual([{ row: 3, column: "pitch", message: expect.stringMatching(/not a pitch/) }]);
  });

  it("header problems: missing, unknown and repeated columns", () => {
    expect(parseRoofCsv("name,slope,shape,shape\nA,6,rectangle,rectangle\n").errors).toEqual([
      { row: 1, column: "slope", message: expect.stringMatching(/Unknown column/) },
      { row: 1, column: "shape", message: "This column appears twice" },
      { row: 1, column: "pitch", message: "Missing column" },
    ]);
  });

  it("an empty file and a file with only a header", () => {
    expect(parseRoofCsv("\uFEFF\r\n").errors).toEqual([{ row: 1, column: "file", message: "The file is empty" }]);
    expect(parseRoofCsv(csv()).errors).toEqual([{ row: 2, column: "file", message: "The file has no plane rows" }]);
  });

  it("at most 500 planes on the roof", () => {
    const r = parseRoofCsv(csv("A,6,rectangle,0,0,10,10,,,,,", "B,6,rectangle,20,0,10,10,,,,,"), { existingCount: 499 });
    expect(r.errors).toEqual([{ row: 3, column: "file", message: "A roof may have at most 500 planes (it has 499)" }]);
  });
});

describe("roofToCsv", () => {
  it("writes every plane as an outline and reads back the same planes", () => {
    const planes = [...hipRoof(40, 30, 6, { idPrefix: "h" }), ...gableRoof(12, 8, 4, { idPrefix: "g", origin: [60, -2.5], stackId: "porch" })];
    const text = roofToCsv(planes);
    expect(text.split("\r\n")[0]).toBe(HEADER);
    const back = parseRoofCsv(text, { stackIds: ["main", "porch"] });
    expect(back.errors).toEqual([]);
    expect(back.planes.map(({ name, pitch, outline, eaveEdge, stackId }) => ({ name, pitch, outline, eaveEdge, stackId }))).toEqual(
      planes.map(({ name, pitch, outline, eaveEdge, stackId }) => ({ name, pitch, outline, eaveEdge, stackId })),
    );
    for (const p of back.planes) expect(isGeometryError(planeGeometry(p, 0))).toBe(false);
  });

  it("quotes names with commas and quotes, and guards names a spreadsheet would run as a formula", () => {
    const text = roofToCsv([
      { name: 'Front, "big"', pitch: 6, outline: [[0, 0], [1, 0], [1, 1]], eaveEdge: 0 },
      { name: "=SUM(A1)", pitch: 6, outline: [[0, 0], [1, 0], [1, 1]], eaveEdge: 0 },
    ]);
    expect(text).toContain('"Front, ""big""",6,outline');
    expect(text).toContain("'=SUM(A1),6,outline");
    expect(parseRoofCsv(text).planes.map((p) => p.name)).toEqual(['Front, "big"', "=SUM(A1)"]);
  });
});
