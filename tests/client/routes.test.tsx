import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import type { TeamMemberDto, UserDto } from "@shared/schemas/auth";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { createAppRoutes } from "@/app/router";
import { LAST_OWNER_MESSAGE } from "@/features/users/components/team-manager";
import { json, stubApi } from "./fetch-stub";

const owner: UserDto = { id: 1, email: "owner@example.com", name: "Dana Example", role: "owner", companyId: 1 };
const crew: UserDto = { id: 3, email: "crew@example.com", name: "Kit Sample", role: "crew", companyId: 1 };
const member = (u: UserDto, extra: Partial<TeamMemberDto> = {}): TeamMemberDto => ({
  ...u,
  active: true,
  createdAt: "2025-01-02T10:00:00.000Z",
  lastLoginAt: null,
  ...extra,
});
const secondOwner: UserDto = { id: 2, email: "partner@example.com", name: "Lee Example", role: "owner", companyId: 1 };

const signedOut = () => json(401, { error: { code: "unauthorized", message: "Please sign in" } });

function renderApp(path: string) {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter(createAppRoutes(qc), { initialEntries: [path] });
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { router, qc };
}

const currentPath = (router: ReturnType<typeof createMemoryRouter>) =>
  router.state.location.pathname + router.state.location.search;

beforeEach(() => {
  resetCsrfToken();
});

describe("routing and the session", () => {
  it("a signed-out visit to /team goes to sign-in with next, and signing in returns there", async () => {
    stubApi({
      "GET /api/auth/me": [signedOut, signedOut, () => json(200, { user: owner })],
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/auth/login": () => json(200, { user: owner }),
      "GET /api/users": () => json(200, { data: [member(owner)] }),
    });
    const { router } = renderApp("/team");

    expect(await screen.findByRole("heading", { name: "Sign in" })).toBeInTheDocument();
    expect(currentPath(router)).toBe("/sign-in?next=%2Fteam");

    const user = userEvent.setup();
    await user.type(screen.getByLabelText("E-mail"), "owner@example.com");
    await user.type(screen.getByLabelText("Password"), "ridgewright-demo");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    expect(await screen.findByRole("heading", { name: "Team" })).toBeInTheDocument();
    expect(currentPath(router)).toBe("/team");
    expect(await screen.findByRole("table", { name: "Team members" })).toBeInTheDocument();
  });

  it("'/' sends a signed-in user to the jobs board", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: crew }),
      "GET /api/jobs": () => json(200, { data: [], meta: { page: 1, pageSize: 25, total: 0 } }),
    });
    const { router } = renderApp("/");
    expect(await screen.findByText("No jobs assigned to you", undefined, { timeout: 5000 })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe("/jobs");
    expect(document.title).toBe("Jobs · Ridgewright");
  });

  it("crew opening /team sees the no-access panel and only Jobs in the navigation", async () => {
    const api = stubApi({ "GET /api/auth/me": () => json(200, { user: crew }) });
    renderApp("/team");

    expect(await screen.findByRole("heading", { name: "You don't have access" })).toBeInTheDocument();
    const nav = screen.getByRole("navigation", { name: "Main" });
    expect(within(nav).getAllByRole("link").map((a) => a.textContent)).toEqual(["Jobs"]);
    expect(api.callsTo("GET /api/users")).toHaveLength(0); // the owner-only list is never requested
  });

  it("an unknown address shows the not-found page inside the shell", async () => {
    stubApi({ "GET /api/auth/me": () => json(200, { user: owner }) });
    renderApp("/no-such-screen");
    expect(await screen.findByRole("heading", { name: "Page not found" })).toBeInTheDocument();
    expect(screen.getByRole("navigation", { name: "Main" })).toBeInTheDocument();
  });

  it("signing out lands on the sign-in page without a next", async () => {
    stubApi({
      "GET /api/auth/me": [() => json(200, { user: owner }), signedOut],
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/auth/logout": () => json(204),
      "GET /api/jobs": () => json(200, { data: [], meta: { page: 1, pageSize: 25, total: 0 } }),
      "GET /api/users": () => json(200, { data: [member(owner)] }),
    });
    const { router } = renderApp("/jobs");
    await screen.findByText("No jobs yet", undefined, { timeout: 5000 });

    await userEvent.setup().click(screen.getByRole("button", { name: "Sign out" }));

    expect(await screen.findByText("You're signed out.")).toBeInTheDocument();
    expect(currentPath(router)).toBe("/sign-in");
  });

  it("signing out from a screen with its own data does not refetch it or come back with a next", async () => {
    const api = stubApi({
      "GET /api/auth/me": [() => json(200, { user: owner }), signedOut],
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/users": [() => json(200, { data: [member(owner)] }), signedOut],
      "POST /api/auth/logout": () => json(204),
    });
    const { router, qc } = renderApp("/team");
    await screen.findByRole("table", { name: "Team members" });

    await userEvent.setup().click(screen.getByRole("button", { name: "Sign out" }));

    expect(await screen.findByText("You're signed out.")).toBeInTheDocument();
    expect(currentPath(router)).toBe("/sign-in");
    expect(api.callsTo("GET /api/users")).toHaveLength(1);
    expect(api.callsTo("GET /api/auth/me")).toHaveLength(2); // the first load and the sign-in page's check
    expect(qc.getQueryCache().getAll()).toHaveLength(0); // nothing of the last session stays cached
  });

  it("a 401 from any query (expired session) sends the user to sign in, with next", async () => {
    stubApi({
      "GET /api/auth/me": [() => json(200, { user: owner }), signedOut],
      "GET /api/users": signedOut,
    });
    const { router } = renderApp("/team");
    expect(await screen.findByRole("heading", { name: "Sign in" })).toBeInTheDocument();
    await waitFor(() => expect(currentPath(router)).toBe("/sign-in?next=%2Fteam"));
  });
});

describe("Team screen", () => {
  it("lists members with role, status and last sign-in", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/users": () =>
        json(200, {
          data: [
            member(owner, { lastLoginAt: "2025-03-01T08:30:00.000Z" }),
            member(crew, { active: false }),
          ],
        }),
    });
    renderApp("/team");
    const table = await screen.findByRole("table", { name: "Team members" });
    const rows = within(table).getAllByRole("row").slice(1);
    expect(rows).toHaveLength(2);
    expect(within(rows[0]!).getByText("Dana Example")).toBeInTheDocument();
    expect(within(rows[0]!).getByText("You")).toBeInTheDocument();
    expect(within(rows[0]!).getByRole("combobox", { name: "Role for Dana Example" })).toBeDisabled();
    expect(within(rows[1]!).getByText("Deactivated")).toBeInTheDocument();
    expect(within(rows[1]!).getByText("Never")).toBeInTheDocument();
    expect(within(rows[1]!).getByRole("button", { name: "Reactivate Kit Sample" })).toBeInTheDocument();
  });

  it("a 409 last_owner refusal is explained in a banner and the role stays as it was", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/users": () => json(200, { data: [member(owner), member(secondOwner)] }),
      "PATCH /api/users/2": () =>
        json(409, { error: { code: "last_owner", message: "The company needs an active owner" } }),
    });
    renderApp("/team");
    const select = await screen.findByRole("combobox", { name: "Role for Lee Example" });

    await userEvent.setup().selectOptions(select, "crew");

    const banner = await screen.findByRole("alert");
    expect(banner).toHaveTextContent("Change not saved");
    expect(banner).toHaveTextContent(LAST_OWNER_MESSAGE);
    expect(api.callsTo("PATCH /api/users/2")[0]!.body).toEqual({ role: "crew" });
    await waitFor(() => expect(select).toHaveValue("owner"));
  });

  it("adding a member posts the form and a 409 puts the message on the e-mail field", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/users": () => json(200, { data: [member(owner)] }),
      "POST /api/users": () => json(409, { error: { code: "conflict", message: "That already exists" } }),
    });
    renderApp("/team");
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Add team member" }));

    const dialog = screen.getByRole("dialog", { name: "Add team member" });
    await user.type(within(dialog).getByLabelText("Name"), "Sam Sample");
    await user.type(within(dialog).getByLabelText("E-mail"), "crew@example.com");
    await user.selectOptions(within(dialog).getByLabelText("Role"), "crew");
    await user.type(within(dialog).getByLabelText("First password"), "a-long-first-password");
    await user.click(within(dialog).getByRole("button", { name: "Add member" }));

    await waitFor(() =>
      expect(within(dialog).getByLabelText("E-mail")).toHaveAccessibleDescription(
        expect.stringContaining("already signs in with this e-mail"),
      ),
    );
    expect(api.callsTo("POST /api/users")[0]!.body).toEqual({
      name: "Sam Sample",
      email: "crew@example.com",
      role: "crew",
      password: "a-long-first-password",
    });
  });
});
