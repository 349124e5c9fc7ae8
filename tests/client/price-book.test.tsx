import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import type { UserDto } from "@shared/schemas/auth";
import type { CatalogItemDto, PriceBookImportPreview } from "@shared/schemas/price-book";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { createAppRoutes } from "@/app/router";
import { json, stubApi } from "./fetch-stub";

const owner: UserDto = { id: 1, email: "owner@example.com", name: "Dana Example", role: "owner", companyId: 1 };
const estimator: UserDto = { id: 2, email: "estimator@example.com", name: "Sam Example", role: "estimator", companyId: 1 };

const item = (extra: Partial<CatalogItemDto> = {}): CatalogItemDto => ({
  id: 11,
  sku: "TR-EAVE-10",
  category: "trim",
  name: "Eave trim, 10 ft",
  purchaseUnit: "pc",
  packCoverage: 1,
  coverageUnit: "pc",
  unitCostCents: 1850,
  wastePct: null,
  materialKey: "trim-eave",
  attributes: {},
  active: true,
  version: 3,
  createdAt: "2025-01-02T10:00:00.000Z",
  updatedAt: "2025-01-02T10:00:00.000Z",
  ...extra,
});

function renderAt(path: string) {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter(createAppRoutes(qc), { initialEntries: [path] });
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { router, qc };
}

beforeEach(() => resetCsrfToken());

describe("price book items", () => {
  it("an inline cost edit sends the new cost in cents with the version it was loaded at", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/price-book/items": () => json(200, { data: [item()] }),
      "PATCH /api/price-book/items/11": ({ body }) =>
        json(200, { data: item({ unitCostCents: (body as { unitCostCents: number }).unitCostCents, version: 4 }) }),
      "GET /api/price-book/mapping": () => json(200, { data: [], conflicts: [] }),
    });
    renderAt("/price-book");

    const cost = await screen.findByLabelText("Cost per pc of TR-EAVE-10", {}, { timeout: 5000 });
    expect(cost).toHaveValue("18.50");
    const user = userEvent.setup();
    await user.clear(cost);
    await user.type(cost, "21.25{Enter}");

    await waitFor(() => expect(api.callsTo("PATCH /api/price-book/items/11")).toHaveLength(1));
    expect(api.callsTo("PATCH /api/price-book/items/11")[0]!.body).toEqual({ unitCostCents: 2125, version: 3 });
    expect(api.callsTo("PATCH /api/price-book/items/11")[0]!.headers["x-csrf-token"]).toBe("t");
    await waitFor(() => expect(screen.getByLabelText("Cost per pc of TR-EAVE-10")).toHaveValue("21.25"));
  });

  it("a value the shared schema refuses is not sent and shows its message in the cell", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/price-book/items": () => json(200, { data: [item()] }),
    });
    renderAt("/price-book");
    const waste = await screen.findByLabelText("Waste percent of TR-EAVE-10");
    const user = userEvent.setup();
    await user.type(waste, "140{Enter}");
    expect(await screen.findByText("At most 100")).toBeInTheDocument();
    expect(waste).toHaveValue("140"); // what was typed stays
    expect(api.callsTo("PATCH /api/price-book/items/11")).toHaveLength(0);
  });

  it("a 409 stale version reloads the list and says the item was changed by someone else", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/price-book/items": [
        () => json(200, { data: [item()] }),
        () => json(200, { data: [item({ unitCostCents: 1999, version: 5 })] }),
      ],
      "PATCH /api/price-book/items/11": () =>
        json(409, {
          error: { code: "stale_version", message: "Someone else changed this item; reload it and try again" },
          currentVersion: 5,
        }),
    });
    renderAt("/price-book");

    const cost = await screen.findByLabelText("Cost per pc of TR-EAVE-10", {}, { timeout: 5000 });
    const user = userEvent.setup();
    await user.clear(cost);
    await user.type(cost, "20{Enter}");

    expect(await screen.findByText(/TR-EAVE-10 was changed by someone else, reloaded/)).toBeInTheDocument();
    expect(screen.getByText(/Your cost \(20\) was not saved/)).toBeInTheDocument();
    // the list came again from the server, with the other person's value
    await waitFor(() => expect(api.callsTo("GET /api/price-book/items")).toHaveLength(2));
    await waitFor(() => expect(screen.getByLabelText("Cost per pc of TR-EAVE-10")).toHaveValue("19.99"));
    expect(api.callsTo("PATCH /api/price-book/items/11")[0]!.body).toEqual({ unitCostCents: 2000, version: 3 });
  });

  it("estimators read the items without edit controls", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/price-book/items": () => json(200, { data: [item()] }),
    });
    renderAt("/price-book");
    const table = await screen.findByRole("table", { name: "Price book items" });
    expect(within(table).getByText("$18.50")).toBeInTheDocument();
    expect(screen.queryByLabelText("Cost per pc of TR-EAVE-10")).not.toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Add item" })).not.toBeInTheDocument();
  });
});

describe("price book CSV import", () => {
  it("checking a file shows the errors by row and column, and Save stays off until the file is valid", async () => {
    const preview: PriceBookImportPreview = {
      valid: false,
      committed: false,
      errors: [
        { row: 3, column: "unit_cost", message: "Enter an amount in dollars, e.g. 12.50" },
        { row: 5, column: "material_key", message: "Unknown material key" },
      ],
      warnings: [],
      rows: [{ row: 2, sku: "TR-EAVE-10", action: "update", changes: ["unit cost 18.50 → 19.00"] }],
      summary: { create: 0, update: 1, unchanged: 0 },
    };
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/price-book/import": () => json(200, { data: preview }),
    });
    renderAt("/price-book?tab=csv");

    const user = userEvent.setup();
    const file = new File(["sku,category\nTR-EAVE-10,trim\n"], "book.csv", { type: "text/csv" });
    await user.upload(await screen.findByLabelText("CSV file"), file);
    await user.click(screen.getByRole("button", { name: "Check file" }));

    const errors = await screen.findByRole("table", { name: "Import errors" });
    const rows = within(errors).getAllByRole("row").slice(1);
    expect(rows.map((r) => within(r).getAllByRole("cell").map((c) => c.textContent))).toEqual([
      ["3", "unit_cost", "Enter an amount in dollars, e.g. 12.50"],
      ["5", "material_key", "Unknown material key"],
    ]);
    expect(screen.getByText("2 problems in 2 rows")).toBeInTheDocument();
    expect(screen.getByRole("button", { name: /^Save/ })).toBeDisabled();
    // a preview, not a commit
    expect(api.callsTo("POST /api/price-book/import")[0]!.path).toBe("/api/price-book/import");
    expect(api.callsTo("POST /api/price-book/import")[0]!.headers["x-csrf-token"]).toBe("t");
  });
});
