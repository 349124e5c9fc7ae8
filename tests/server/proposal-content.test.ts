import { describe, expect, it } from "vitest";
import { stackSchema } from "@shared/schemas/takeoff";
import {
  formatDate,
  formatFeetInches,
  formatInchesAsFeet,
  formatMoney,
  formatPitch,
  formatSquares,
  proposalDocSchema,
} from "@shared/schemas/proposal";
import {
  addDaysIso,
  applyOptionSpec,
  buildProposalDoc,
  describeStack,
  stackFactsFromTakeoff,
  type StackFacts,
} from "@server/services/proposal-content";
import { DEMO_OPTIONS, demoRoof, proposalInput, takeoffFor } from "../helpers/proposal-fixtures";

const facts = (over: Partial<StackFacts> = {}): StackFacts => ({
  gapIn: 1.5,
  channelHeightIn: 0.75,
  continuous: true,
  qualifies: true,
  blockedByBattens: false,
  iceBarrierWidthIn: null,
  edgeTypes: ["eave", "rake", "ridge"],
  clipSpacingIn: { field: 24, corner: 12 },
  ...over,
});
const text = (layers: { title: string; sentences: string[] }[]) => layers.map((l) => `${l.title}: ${l.sentences.join(" ")}`).join("\n");

describe("formatters", () => {
  it.each([
    [1_234_567, "$12,345.67"],
    [5, "$0.05"],
    [100, "$1.00"],
    [-120_000, "-$1,200.00"],
    [123_456_789_00, "$123,456,789.00"],
  ])("formatMoney(%i) = %s", (cents, out) => expect(formatMoney(cents)).toBe(out));

  it.each([
    [12.5, `12' 6"`],
    [7, `7' 0"`],
    [0.25, `3"`],
    [11.99, `12' 0"`], // 143.88 in rounds to 144 in
  ])("formatFeetInches(%d) = %s", (ft, out) => expect(formatFeetInches(ft)).toBe(out));

  it("prints panel lengths in whole inches as feet-inches", () => {
    expect(formatInchesAsFeet(281)).toBe(`23' 5"`);
  });

  it.each([
    [24.63, "24.6"],
    [0.96, "1.0"],
    [1234.56, "1,234.6"],
    [3, "3.0"],
  ])("formatSquares(%d) = %s (one decimal)", (sq, out) => expect(formatSquares(sq)).toBe(out));

  it("prints pitch per 12 and dates without a time-zone shift", () => {
    expect(formatPitch(6)).toBe("6/12");
    expect(formatPitch(4.5)).toBe("4.5/12");
    expect(formatDate("2026-03-05")).toBe("March 5, 2026");
    expect(formatDate("2026-12-31T23:59:00Z")).toBe("December 31, 2026");
    expect(addDaysIso("2026-03-05T15:30:00Z", 30)).toBe("2026-04-04");
  });
});

describe("describeStack", () => {
  const base = stackSchema.parse({ id: "s" });

  it("says the foil faces up toward the air gap and why, for foil on the deck under a spacer", () => {
    const s = stackSchema.parse({
      id: "s",
      spacer: { kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: true } },
      radiantBarrier: { kind: "foil", position: "on-deck", reflectiveFace: "up" },
    });
    const layers = describeStack(s, facts());
    const t = text(layers);
    expect(layers.map((l) => l.title)).toEqual(["Roof deck", "Underlayment", "Reflective foil", "Spacer and air gap", "Vent openings", "Metal panels", "Trim and flashing"]);
    expect(t).toContain("shiny side facing up, toward the air gap");
    expect(t).toContain("Why it faces the gap");
    expect(t).toContain("Why the air gap");
    expect(t).toContain("every 24 inches");
    expect(t).toContain("1-1/2 inches above the deck");
    expect(t).toContain("warm air rises through it");
  });

  it("says the foil faces down when it hangs under the panels, and puts it above the spacer", () => {
    const s = stackSchema.parse({ id: "s", spacer: { kind: "mesh" }, radiantBarrier: { kind: "foil", position: "under-panels", reflectiveFace: "down" } });
    const layers = describeStack(s, facts({ gapIn: 0.3, channelHeightIn: 0.3, qualifies: false }));
    const titles = layers.map((l) => l.title);
    expect(titles.indexOf("Reflective foil")).toBeGreaterThan(titles.indexOf("Spacer and air gap"));
    expect(text(layers)).toContain("shiny side facing down, toward the air gap below it");
    // ORNL / Title 24 (2008): a channel under 3/4 in is not counted as ventilation.
    expect(text(layers)).toContain("too thin to count as roof ventilation");
    expect(titles).not.toContain("Vent openings");
  });

  it("warns that foil with no gap does little", () => {
    const s = stackSchema.parse({ id: "s", radiantBarrier: { kind: "foil" } });
    const t = text(describeStack(s, facts({ gapIn: 0, channelHeightIn: 0, qualifies: false, continuous: false })));
    expect(t).toContain("no air gap to face");
    expect(t).toContain("No spacer");
  });

  it("explains that battens alone close the channel", () => {
    const s = stackSchema.parse({ id: "s", spacer: { kind: "battens", battens: { counterBattens: false } } });
    const t = text(describeStack(s, facts({ gapIn: 0.75, qualifies: false, continuous: false, blockedByBattens: true })));
    expect(t).toContain("close the gap at every row");
  });

  it("describes deck work, ice barrier, underlayment and exposed-fastener panels in plain words", () => {
    const s = stackSchema.parse({
      id: "s",
      deck: { action: "replace", material: "osb", thicknessIn: 0.625 },
      underlayment: { kind: "felt", feltNumber: 30, layers: 2 },
      panel: { system: "exposed-fastener", coverageWidthIn: 36, gauge: 26, solarReflectance: 0.27 },
    });
    const t = text(describeStack(s, facts({ iceBarrierWidthIn: 36, gapIn: 0, qualifies: false, edgeTypes: ["eave", "valley"] })));
    expect(t).toContain("5/8 inch OSB");
    expect(t).toContain("ice dams");
    expect(t).toContain("No. 30 roofing felt");
    expect(t).toContain("two overlapping layers");
    expect(t).toContain("sealing washers");
    expect(t).toContain("about 27% of the sun's energy");
    expect(t).toContain("valley pan");
    expect(describeStack(base, facts()).length).toBeGreaterThan(3);
  });
});

describe("buildProposalDoc", () => {
  const input = proposalInput({ optionCount: 3 });
  const doc = buildProposalDoc(input);

  it("produces a document the shared schema accepts", () => {
    expect(proposalDocSchema.safeParse(doc).success).toBe(true);
  });

  it("dates the proposal and its validity from the issue date and settings", () => {
    expect(doc.date).toBe("2026-03-05");
    expect(doc.validUntil).toBe("2026-04-04");
    expect(buildProposalDoc({ ...input, validUntil: "2026-03-20T00:00:00Z" }).validUntil).toBe("2026-03-20");
  });

  it("has one scope area per stack in use, with the planes, squares and pitch from the takeoff", () => {
    const t = input.options[0].takeoff;
    expect(doc.scope.areas.map((a) => a.title)).toEqual(["Main roof", "Porch roof"]);
    const all = doc.scope.areas.flatMap((a) => a.planes);
    expect(all).toHaveLength(input.roof.planes.length);
    for (const p of all) {
      const r = t.planes.find((x) => x.id === p.id)!;
      expect(p.squares).toBeCloseTo(r.squares, 9);
      expect(p.pitch).toBe(r.pitch);
    }
    expect(doc.scope.totalSquares).toBeCloseTo(t.totals.squares, 9);
    expect(doc.scope.preparation[0]).toContain("2 layers");
  });

  it("lists each option's totals and what differs from the first", () => {
    expect(doc.options.map((o) => o.label)).toEqual(DEMO_OPTIONS.slice(0, 3).map((o) => o.label));
    doc.options.forEach((o, i) => {
      expect(o.totalCents).toBe(input.options[i].totals.totalCents);
      expect(o.priceCents + o.taxCents).toBe(o.totalCents);
      expect(o.depositCents).toBe(input.options[i].totals.depositCents);
    });
    expect(doc.options[0].differences[0]).toContain("as described in the scope");
    const mesh = doc.options[1].differences.join(" ");
    expect(mesh).toContain("3D plastic mesh mat instead of wood battens over counter-battens");
    expect(mesh).toContain(`-${formatMoney(DEMO_OPTIONS[0].totalCents - DEMO_OPTIONS[1].totalCents)} compared with`);
    const bare = doc.options[2].differences.join(" ");
    expect(bare).toContain("No spacer");
    expect(bare).toContain("Leaves out the reflective foil layer");
  });

  it("uses the company's own exclusions and warranty when it has them, and generic ones otherwise", () => {
    expect(doc.exclusions.length).toBeGreaterThan(3);
    expect(doc.warranty.join(" ")).toContain("Workmanship");
    const own = buildProposalDoc({ ...input, company: { ...input.company, exclusions: "- Gutters\n- Skylights", warranty: "Five years on labour." } });
    expect(own.exclusions).toEqual(["Gutters", "Skylights"]);
    expect(own.warranty).toEqual(["Five years on labour."]);
  });

  it("carries the safety cautions and the codes-govern statement", () => {
    expect(doc.cautions.items.map((c) => c.title)).toEqual(["Falls", "Power lines", "Hot metal", "Sharp edges"]);
    expect(doc.cautions.items[0].text).toContain("up to 8/12");
    expect(doc.cautions.governs).toContain("panel maker's tested installation details");
    expect(doc.cautions.governs).toContain("licensed professionals");
  });

  it("fills the acceptance block only for a known option", () => {
    expect(doc.acceptance).toBeNull();
    const accepted = buildProposalDoc({ ...input, acceptance: { signerName: "Zoë Łukasiewicz", acceptedAt: "2026-03-09T18:22:00Z", optionId: "102" } });
    expect(accepted.acceptance).toEqual({ signerName: "Zoë Łukasiewicz", acceptedAt: "2026-03-09T18:22:00Z", optionId: "102", optionLabel: DEMO_OPTIONS[1].label });
    expect(buildProposalDoc({ ...input, acceptance: { signerName: "X", acceptedAt: "2026-03-09T18:22:00Z", optionId: "999" } }).acceptance).toBeNull();
  });

  it("refuses a proposal without options", () => {
    expect(() => buildProposalDoc({ ...input, options: [] })).toThrow(RangeError);
  });
});

describe("applyOptionSpec and stackFactsFromTakeoff", () => {
  it("rewrites the spacer and foil and keeps the rest of the stack", () => {
    const s = stackSchema.parse({ id: "s", spacer: { kind: "battens", battens: { nominal: "2x2", spacingIn: 16 } }, radiantBarrier: { kind: "foil" } });
    const c = applyOptionSpec(s, { spacer: "counter-battens", foil: false });
    expect(c.spacer.kind).toBe("battens");
    expect(c.spacer.battens).toMatchObject({ nominal: "2x2", spacingIn: 16, counterBattens: true });
    expect(c.radiantBarrier.kind).toBe("none");
    expect(c.panel).toEqual(s.panel);
    expect(applyOptionSpec(s, {})).toEqual(s);
  });

  it("reads the channel of a stack from a real takeoff", () => {
    const roof = demoRoof();
    const t = takeoffFor(roof);
    const upper = stackFactsFromTakeoff(t, "upper")!;
    // NIST PS 20 dressed 1x4 = 3/4 in: counter-battens + battens = 1.5 in gap, 3/4 in channel.
    expect(upper.gapIn).toBeCloseTo(1.5, 6);
    expect(upper.qualifies).toBe(true);
    expect(upper.iceBarrierWidthIn).toBeGreaterThan(0);
    expect(stackFactsFromTakeoff(t, "nope")).toBeNull();
  });
});
