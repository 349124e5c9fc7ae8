import { describe, expect, it } from "vitest";
import { crewSafetyCautions } from "../../server/services/install-packet-content";

describe("the crew's safety cautions", () => {
  it("asks for fall protection at 6 ft and more at any slope, and names the steep-roof systems above 4/12", () => {
    // OSHA 29 CFR 1926.501(b)(13): residential construction 6 ft or more above a lower level;
    // 1926.500(b): a steep roof is over 4 in 12; 1926.501(b)(11): guardrails with toeboards, nets or personal fall arrest.
    const low = crewSafetyCautions(4);
    const steep = crewSafetyCautions(9);
    const falls = (c: ReturnType<typeof crewSafetyCautions>) => c.items.find((i) => i.title === "Falls")!.text;
    expect(falls(low)).toMatch(/6 ft or more/);
    expect(falls(low)).not.toMatch(/Steep roof/);
    expect(falls(steep)).toMatch(/Steep roof: up to 9\/12/);
    expect(falls(steep)).toMatch(/toeboards/);
  });

  it("covers power lines, hot metal and sharp edges for the crew, and defers to the maker's details and local codes", () => {
    const c = crewSafetyCautions(6);
    expect(c.items.map((i) => i.title)).toEqual(["Falls", "Power lines", "Hot metal", "Sharp edges"]);
    expect(c.items.map((i) => i.text).join(" ")).not.toMatch(/children and pets|price with you/); // not the homeowner's wording
    expect(c.governs).toMatch(/panel maker's tested installation details and local codes govern/);
  });
});
