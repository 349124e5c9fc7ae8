import { describe, expect, it, vi } from "vitest";
import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { MemoryRouter } from "react-router-dom";
import type { Role } from "@shared/auth/roles";
import { AppShell } from "@/components/layout/app-shell";

function renderShell(role: Role, onSignOut = vi.fn()) {
  render(
    <MemoryRouter initialEntries={["/jobs"]}>
      <AppShell user={{ name: "Robin Sample", role }} onSignOut={onSignOut}>
        <p>screen</p>
      </AppShell>
    </MemoryRouter>,
  );
  const nav = screen.getByRole("navigation", { name: "Main" });
  return within(nav)
    .getAllByRole("link")
    .map((a) => a.textContent);
}

describe("AppShell navigation", () => {
  it("shows the owner Jobs, Customers, Approvals, Price book, Team and Company", () => {
    expect(renderShell("owner")).toEqual(["Jobs", "Customers", "Approvals", "Price book", "Team", "Company"]);
  });

  it("shows the estimator Jobs, Customers and Price book (no Company, Team or Approvals)", () => {
    expect(renderShell("estimator")).toEqual(["Jobs", "Customers", "Price book"]);
  });

  it("shows crew only Jobs", () => {
    expect(renderShell("crew")).toEqual(["Jobs"]);
  });

  it("marks the current screen and links to the right paths", () => {
    renderShell("owner");
    const nav = screen.getByRole("navigation", { name: "Main" });
    expect(within(nav).getByRole("link", { name: "Jobs" })).toHaveAttribute("aria-current", "page");
    expect(within(nav).getByRole("link", { name: "Price book" })).toHaveAttribute("href", "/price-book");
  });

  it("shows the user's name and role, Account, and a Sign out button that calls onSignOut", async () => {
    const onSignOut = vi.fn();
    renderShell("estimator", onSignOut);
    expect(screen.getByText("Robin Sample")).toBeInTheDocument();
    expect(screen.getAllByText(/Estimator/).length).toBeGreaterThan(0);
    expect(screen.getByRole("link", { name: "Account" })).toHaveAttribute("href", "/account");
    await userEvent.setup().click(screen.getByRole("button", { name: "Sign out" }));
    expect(onSignOut).toHaveBeenCalledTimes(1);
  });

  it("shows the product name", () => {
    renderShell("crew");
    expect(screen.getByRole("link", { name: /Ridgewright/ })).toHaveAttribute("href", "/jobs");
  });
});
