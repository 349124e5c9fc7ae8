import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { fmt, num, roundedUp, toFixedFast, wasteText, zoneListText } from "@shared/engine/format";

// The reference throughout is ECMA-262 Number.prototype.toFixed itself: toFixedFast must give its very text
// for every number and 0 … 4 digits, and fmt the text of toFixed with separators inserted by the rule below.

/** fmt as first written: toFixed, then a comma before each group of three integer digits from the right. */
function fmtReference(n: number, digits = 1): string {
  const s = Math.abs(n).toFixed(digits);
  const dot = s.indexOf(".");
  const intLen = dot < 0 ? s.length : dot;
  const body = s.slice(0, intLen).replace(/\B(?=(\d{3})+(?!\d))/g, ",") + s.slice(intLen);
  return n < 0 ? "-" + body : body;
}

/** The double just above (+1) or below (−1) a positive finite x. */
function neighbour(x: number, dir: 1 | -1): number {
  const buf = new Float64Array([x]);
  const bits = new BigUint64Array(buf.buffer);
  bits[0] += BigInt(dir);
  return buf[0];
}

const digitsArb = fc.integer({ min: 0, max: 4 });
/** Doubles of every size the takeoff writes and far beyond (1e-6 … 1e22), and any double at all. */
const anyDouble = fc.oneof(
  fc.double({ min: 0, max: 1e22, noNaN: true }),
  fc.double({ min: 0, max: 1e4, noNaN: true }),
  fc.double({ min: 0, max: 1, noNaN: true }),
  fc.double(),
);
/** Exact half-way points k.5 / 10^d (as near as a double gets) and their neighbours on either side. */
const halfWay = fc
  .record({ k: fc.integer({ min: 0, max: 2 ** 40 }), d: digitsArb, step: fc.constantFrom(0 as const, 1 as const, -1 as const) })
  .map(({ k, d, step }) => {
    const h = (k + 0.5) / 10 ** d;
    return { x: step === 0 || h === 0 ? h : neighbour(h, step), d };
  });

describe("toFixedFast", () => {
  it("gives toFixed's text for any double and 0 … 4 digits", () => {
    fc.assert(
      fc.property(anyDouble, digitsArb, (x, d) => {
        expect(toFixedFast(x, d)).toBe(x.toFixed(d));
      }),
      { numRuns: 100_000, seed: 1301 },
    );
  });

  it("gives toFixed's text at and next to every kind of half-way point", () => {
    fc.assert(
      fc.property(halfWay, ({ x, d }) => {
        expect(toFixedFast(x, d)).toBe(x.toFixed(d));
      }),
      { numRuns: 200_000, seed: 1302 },
    );
  });

  it("gives toFixed's text for decimals with few places (the figures of a takeoff)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1e9 }), fc.integer({ min: 0, max: 6 }), digitsArb, (k, places, d) => {
        const x = k / 10 ** places;
        expect(toFixedFast(x, d)).toBe(x.toFixed(d));
      }),
      { numRuns: 100_000, seed: 1303 },
    );
  });

  it("matches toFixed on the classic cases", () => {
    // ECMA-262 toFixed works on the exact binary value: 1.005 is stored a little below 1.005, so it rounds down.
    expect(toFixedFast(1.005, 2)).toBe("1.00");
    expect(toFixedFast(1.045, 2)).toBe((1.045).toFixed(2));
    // Ties go to the larger integer: 0.5 → "1", 2.5 → "3".
    expect(toFixedFast(0.5, 0)).toBe("1");
    expect(toFixedFast(2.5, 0)).toBe("3");
    expect(toFixedFast(-0, 2)).toBe("0.00");
    for (const x of [NaN, Infinity, 1e15, 1e21, 2 ** 53, -1.5, 5e-324]) {
      for (let d = 0; d <= 4; d++) expect(toFixedFast(x, d)).toBe(x.toFixed(d));
    }
  });
});

describe("fmt, num and wasteText", () => {
  it("fmt gives the reference text (toFixed, then separators) for any number", () => {
    fc.assert(
      fc.property(fc.oneof(fc.double({ min: -1e22, max: 1e22, noNaN: true }), fc.double()), fc.integer({ min: 0, max: 4 }), (x, d) => {
        expect(fmt(x, d)).toBe(fmtReference(x, d));
      }),
      { numRuns: 100_000, seed: 1304 },
    );
    expect(fmt(1234567.891, 2)).toBe("1,234,567.89");
    expect(fmt(-999.95)).toBe("-1,000.0");
    expect(fmt(1e21)).toBe(fmtReference(1e21));
  });

  it("num rounds through toFixed and wasteText writes 1 + pct / 100 to two places", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (x) => {
        expect(num(x)).toBe(Number.isInteger(x) && Math.abs(x) < 1000 ? String(x) : numReference(x));
        expect(wasteText(x / 1000)).toBe((1 + x / 1000 / 100).toFixed(2));
      }),
      { numRuns: 50_000, seed: 1305 },
    );
  });
});

/** num as first written, for numbers that are not small whole numbers. */
function numReference(n: number, digits = 2): string {
  const r = Number(n.toFixed(digits));
  if (Math.abs(r) < 1000) return String(r);
  return fmtReference(r, (r.toString().split(".")[1] ?? "").length);
}

describe("roundedUp (the last step of a basis, in words)", () => {
  it("names the exact figure and the whole count it is rounded up to", () => {
    expect(roundedUp(0.81, 1, "roll")).toBe("0.81, rounded up to 1 roll");
    expect(roundedUp(1566.71, 1567, "piece")).toBe("1,566.71, rounded up to 1567 pieces");
    expect(roundedUp(4.41, 5, "box", "boxes")).toBe("4.41, rounded up to 5 boxes");
  });
  it("gives the count alone when the figure is already whole (within the rounding tolerance)", () => {
    expect(roundedUp(2, 2, "roll")).toBe("2 rolls");
    expect(roundedUp(1036 + 1e-12, 1036, "lf", "lf")).toBe("1036 lf");
    expect(roundedUp(0, 0, "tube")).toBe("0 tubes");
  });
});

describe("zoneListText", () => {
  it("puts wind zones in words, lowest first", () => {
    expect(zoneListText(["3"])).toBe("zone 3");
    expect(zoneListText(["3", "2"])).toBe("zones 2 and 3");
    expect(zoneListText(["3", "1", "2"])).toBe("zones 1, 2 and 3");
  });
});
