import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { createAppRoutes } from "@/app/router";
import { json, stubApi } from "./fetch-stub";
import { crew, customer, estimator, page } from "./jobs-fixtures";

function renderApp(path: string) {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter(createAppRoutes(qc), { initialEntries: [path] });
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { router };
}

const findTable = () => screen.findByRole("table", { name: "Customers" }, { timeout: 5000 });
const rowOf = (name: string) => screen.getByRole("button", { name: `Archive ${name}` }).closest("tr")!;

const ada = customer(5, { name: "Ada Quarry", email: "ada.quarry@exmaple.com" }); // the typo to fix
const ben = customer(6, { name: "Ben Marsh", email: null });

beforeEach(() => {
  resetCsrfToken();
});

describe("customers screen", () => {
  it("lists customers for an estimator, flags a missing e-mail, and searches through the API", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/customers": (call) => json(200, call.path.includes("q=marsh") ? page([ben]) : page([ada, ben])),
    });
    const { router } = renderApp("/customers");
    const table = await findTable();
    expect(within(table).getAllByRole("row")).toHaveLength(3);
    expect(within(rowOf("Ben Marsh")).getByText("No e-mail")).toBeInTheDocument();

    await userEvent.setup().type(screen.getByRole("searchbox", { name: "Search customers" }), "marsh");
    await waitFor(() => expect(api.callsTo("GET /api/customers").at(-1)!.path).toContain("q=marsh"));
    await waitFor(() => expect(within(screen.getByRole("table", { name: "Customers" })).getAllByRole("row")).toHaveLength(2));
    expect(router.state.location.search).toBe("?q=marsh");
  });

  it("editing fixes an e-mail: the form starts with the current values and PATCHes the new one", async () => {
    const fixed = { ...ada, email: "ada.quarry@example.com" };
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/customers": [() => json(200, page([ada, ben])), () => json(200, page([fixed, ben]))],
      "PATCH /api/customers/5": () => json(200, { data: fixed }),
      "GET /api/jobs": () => json(200, page([])),
    });
    renderApp("/customers");
    await findTable();
    const user = userEvent.setup();

    await user.click(screen.getByRole("button", { name: "Edit Ada Quarry" }));
    const dialog = screen.getByRole("dialog", { name: "Edit Ada Quarry" });
    const email = within(dialog).getByLabelText("E-mail");
    expect(email).toHaveValue("ada.quarry@exmaple.com");
    expect(within(dialog).getByLabelText("Name")).toHaveValue("Ada Quarry");
    await user.clear(email);
    await user.type(email, "Ada.Quarry@Example.com");
    await user.click(within(dialog).getByRole("button", { name: "Save changes" }));

    await waitFor(() => expect(screen.queryByRole("dialog")).not.toBeInTheDocument());
    const body = api.callsTo("PATCH /api/customers/5")[0]!.body as Record<string, unknown>;
    expect(body.email).toBe("ada.quarry@example.com"); // trimmed and lower-cased by the shared schema
    expect(body.name).toBe("Ada Quarry");
    expect(await screen.findByText("ada.quarry@example.com")).toBeInTheDocument();
  });

  it("a server error on the e-mail lands on the field and keeps what was typed", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/customers": () => json(200, page([ada])),
      "PATCH /api/customers/5": () =>
        json(400, {
          error: { code: "bad_request", message: "Please check the highlighted fields", fields: { email: "Too long" } },
        }),
    });
    renderApp("/customers");
    await findTable();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "Edit Ada Quarry" }));
    const dialog = screen.getByRole("dialog", { name: "Edit Ada Quarry" });
    const email = within(dialog).getByLabelText("E-mail");
    await user.clear(email);
    await user.type(email, "ada@example.com");
    await user.click(within(dialog).getByRole("button", { name: "Save changes" }));

    await waitFor(() => expect(email).toHaveAccessibleDescription(expect.stringContaining("Too long")));
    expect(email).toHaveValue("ada@example.com");
    expect(screen.getByRole("dialog", { name: "Edit Ada Quarry" })).toBeInTheDocument();
  });

  it("archiving asks first, then posts the archive and refreshes the list", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/customers": [() => json(200, page([ada, ben])), () => json(200, page([ben]))],
      "POST /api/customers/5/archive": () => json(200, { data: { ...ada, archivedAt: "2026-12-01T10:00:00.000Z" } }),
      "GET /api/jobs": () => json(200, page([])),
    });
    renderApp("/customers");
    await findTable();
    const user = userEvent.setup();

    await user.click(screen.getByRole("button", { name: "Archive Ada Quarry" }));
    const confirm = screen.getByRole("dialog", { name: "Archive Ada Quarry?" });
    expect(api.callsTo("POST /api/customers/5/archive")).toHaveLength(0); // nothing until confirmed
    await user.click(within(confirm).getByRole("button", { name: "Archive" }));

    await waitFor(() => expect(api.callsTo("POST /api/customers/5/archive")).toHaveLength(1));
    await waitFor(() => expect(screen.queryByRole("dialog")).not.toBeInTheDocument());
    await waitFor(() => expect(screen.queryByRole("button", { name: "Edit Ada Quarry" })).not.toBeInTheDocument());
  });

  it("the archived view lists archived customers and restores one", async () => {
    const archived = { ...ben, archivedAt: "2026-11-30T10:00:00.000Z" };
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/customers": (call) => json(200, call.path.includes("archived=1") ? page([archived]) : page([ada])),
      "POST /api/customers/6/restore": () => json(200, { data: ben }),
      "GET /api/jobs": () => json(200, page([])),
    });
    renderApp("/customers");
    await findTable();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "Archived" }));
    await user.click(await screen.findByRole("button", { name: "Restore Ben Marsh" }));
    await waitFor(() => expect(api.callsTo("POST /api/customers/6/restore")).toHaveLength(1));
  });

  it("adding a customer validates with the shared schema before sending", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: estimator }),
      "GET /api/customers": () => json(200, page([])),
    });
    renderApp("/customers");
    const user = userEvent.setup();
    await user.click((await screen.findAllByRole("button", { name: "Add customer" }, { timeout: 5000 }))[0]!);
    const dialog = screen.getByRole("dialog", { name: "Add customer" });
    await user.click(within(dialog).getByRole("button", { name: "Add customer" }));
    await waitFor(() => expect(within(dialog).getByLabelText("Name")).toHaveAccessibleDescription("Required"));
    expect(api.calls.filter((c) => c.method !== "GET")).toHaveLength(0);
  });

  it("crew can't open Customers", async () => {
    const api = stubApi({ "GET /api/auth/me": () => json(200, { user: crew }) });
    renderApp("/customers");
    expect(await screen.findByRole("heading", { name: "You don't have access" }, { timeout: 5000 })).toBeInTheDocument();
    expect(api.callsTo("GET /api/customers")).toHaveLength(0);
  });
});
