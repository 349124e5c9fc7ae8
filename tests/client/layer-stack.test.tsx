import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { MemoryRouter } from "react-router-dom";
import { resetCsrfToken } from "@/lib/api-client";
import { roofDraftStore } from "@/features/roof/api/roof-draft";
import { LayerStackSection } from "@/features/roof/components/layer-stack-section";
import { json, stubApi } from "./fetch-stub";
import { baseRoutes, demoRoof, JOB_ID } from "./stack-fixtures";

function renderSection() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={qc}>
      <MemoryRouter>
        <LayerStackSection jobId={JOB_ID} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

const draftStack = (id: string) => roofDraftStore.get(JOB_ID)!.doc.stacks.find((s) => s.id === id)!;

beforeEach(() => {
  resetCsrfToken();
  roofDraftStore.clearAll();
  localStorage.clear();
});

describe("Layer stack section", { timeout: 20_000 }, () => {
  it("changing the spacer writes the draft and redraws the cross-section", async () => {
    stubApi(baseRoutes());
    renderSection();
    const user = userEvent.setup();

    const spacer = await screen.findByLabelText("Spacer");
    expect(spacer).toHaveValue("battens");
    const section = screen.getByTestId("cross-section");
    // 1x4 battens laid flat: 3/4 in gap (NIST PS 20 dressed size), closed at every row without counter-battens
    expect(section).toHaveAttribute("data-gap-in", "0.75");
    expect(section).toHaveAttribute("data-airflow", "blocked");
    expect(screen.getAllByTestId("batten").length).toBeGreaterThan(0);

    await user.selectOptions(spacer, "mesh");

    await waitFor(() => expect(draftStack("battens").spacer?.kind).toBe("mesh"));
    expect(roofDraftStore.get(JOB_ID)!.dirty).toBe(true);
    // mesh mat default thickness 0.3 in (common practice, maker-dependent): continuous and open, under 3/4 in
    await waitFor(() => expect(screen.getByTestId("cross-section")).toHaveAttribute("data-gap-in", "0.3"));
    expect(screen.getByTestId("cross-section")).toHaveAttribute("data-airflow", "open");
    expect(screen.queryAllByTestId("batten")).toHaveLength(0);
    expect(screen.getByTestId("airflow-status")).toHaveTextContent("thermal break");
    // the mat's own fields appear, with the default as placeholder
    expect(screen.getByLabelText("Thickness (in)")).toHaveAttribute("placeholder", "0.3");

    // counter-battens open the channel: 3/4 in counter-batten under 3/4 in batten = 1-1/2 in gap
    await user.selectOptions(screen.getByLabelText("Spacer"), "battens");
    await user.click(screen.getByLabelText(/Counter-battens under them/));
    await waitFor(() => expect(draftStack("battens").spacer?.battens?.counterBattens).toBe(true));
    await waitFor(() => expect(screen.getByTestId("cross-section")).toHaveAttribute("data-gap-in", "1.5"));
    expect(screen.getByTestId("airflow")).toBeInTheDocument();
  }, 20_000);

  it("foil facing the deck shows the warning, in the drawing and beside the radiant-barrier layer", async () => {
    stubApi(baseRoutes());
    renderSection();
    const user = userEvent.setup();

    const face = await screen.findByLabelText("Reflective face");
    expect(screen.getByTestId("foil-status")).toHaveTextContent("reflective face → air gap");

    await user.selectOptions(face, "down");

    await waitFor(() => expect(draftStack("battens").radiantBarrier?.reflectiveFace).toBe("down"));
    await waitFor(() => expect(screen.getByTestId("foil-status")).toHaveTextContent("Warning: foil faces nothing"));
    // the live engine preview raises its error and it is shown in the radiant-barrier card (ASTM C1158)
    const card = document.querySelector('[data-layer="radiantBarrier"]') as HTMLElement;
    await waitFor(() => expect(within(card).getByText(/gives no radiant benefit/)).toBeInTheDocument());
    expect(card.querySelector('[data-code="foil-faces-no-air-space"]')).not.toBeNull();
  });

  it("shows a field error from the shared schema and keeps the invalid value out of the draft", async () => {
    stubApi(baseRoutes());
    renderSection();
    const user = userEvent.setup();
    const coverage = await screen.findByLabelText("Coverage width (in)");
    await user.clear(coverage);
    await user.type(coverage, "75");
    expect(await screen.findByText("At most 60 in")).toBeInTheDocument();
    // "7" was valid on the way and went into the draft; the invalid 75 never does
    expect(draftStack("battens").panel?.coverageWidthIn).toBe(7);
  });

  it("will not delete a stack still used by planes and names them", async () => {
    stubApi(baseRoutes());
    renderSection();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: /Mesh on the porch/ }));
    await user.click(screen.getByRole("button", { name: "Delete" }));
    expect(await screen.findByText(/Still used by plane .*porch/)).toBeInTheDocument();
    expect(roofDraftStore.get(JOB_ID)!.doc.stacks).toHaveLength(2);
  });

  it("saves the draft with its base version and offers reload on 409", async () => {
    const api = stubApi({
      ...baseRoutes(),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      [`PUT /api/jobs/${JOB_ID}/roof`]: () => json(409, { error: { code: "stale_version", message: "The roof was changed by someone else" } }),
    });
    renderSection();
    const user = userEvent.setup();
    await user.selectOptions(await screen.findByLabelText("Spacer"), "dimpled");
    await waitFor(() => expect(draftStack("battens").spacer?.kind).toBe("dimpled"));
    await user.click(screen.getByRole("button", { name: "Save roof" }));
    expect(await screen.findByText("The roof was changed by someone else")).toBeInTheDocument();
    const put = api.callsTo(`PUT /api/jobs/${JOB_ID}/roof`)[0]!;
    expect((put.body as { version: number }).version).toBe(demoRoof().version);
    // nothing typed is lost
    expect(draftStack("battens").spacer?.kind).toBe("dimpled");
    expect(screen.getByRole("button", { name: "Reload the saved roof" })).toBeInTheDocument();
  });
});
