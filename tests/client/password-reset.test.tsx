import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { SignInRoute } from "@/app/routes/sign-in";
import { ForgotPasswordRoute, ResetPasswordRoute } from "@/app/routes/password-reset";
import { FORGOT_SENT_MESSAGE } from "@/features/password-reset/components/forgot-password-form";
import { json, stubApi } from "./fetch-stub";

function renderAt(entry: string) {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter(
    [
      { path: "/sign-in", element: <SignInRoute /> },
      { path: "/forgot-password", element: <ForgotPasswordRoute /> },
      { path: "/reset-password", element: <ResetPasswordRoute /> },
    ],
    { initialEntries: [entry] },
  );
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}

const TOKEN = "rst_abcDEF123456_-xyz";

beforeEach(() => resetCsrfToken());

describe("Forgot and reset password", () => {
  it("links from the sign-in page to the forgot-password page", async () => {
    stubApi({});
    const user = userEvent.setup();
    const router = renderAt("/sign-in");
    await user.click(screen.getByRole("link", { name: "Forgot your password?" }));
    expect(router.state.location.pathname).toBe("/forgot-password");
    expect(await screen.findByRole("heading", { name: "Forgot your password?" })).toBeInTheDocument();
  });

  it("asks for a link with the CSRF token and always shows the same answer", async () => {
    const api = stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "csrf-9" }),
      "POST /api/auth/forgot": () => json(202, { message: "If that e-mail belongs to an account, a link is on its way." }),
    });
    const user = userEvent.setup();
    renderAt("/forgot-password");
    await user.click(screen.getByRole("button", { name: "Send me a reset link" }));
    expect(await screen.findByText("Required")).toBeInTheDocument();
    expect(api.callsTo("POST /api/auth/forgot")).toHaveLength(0);

    await user.type(screen.getByLabelText("E-mail"), "Nobody@Example.com");
    await user.click(screen.getByRole("button", { name: "Send me a reset link" }));
    expect(await screen.findByText(FORGOT_SENT_MESSAGE)).toBeInTheDocument();
    const call = api.callsTo("POST /api/auth/forgot")[0]!;
    expect(call.body).toEqual({ email: "nobody@example.com" });
    expect(call.headers["x-csrf-token"]).toBe("csrf-9");
  });

  it("sets a new password (both typed the same), then shows the sign-in page with a message", async () => {
    const api = stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "csrf-9" }),
      "POST /api/auth/reset": () => new Response(null, { status: 204 }),
    });
    const user = userEvent.setup();
    const router = renderAt(`/reset-password?token=${TOKEN}`);
    await user.type(screen.getByLabelText("New password"), "a-new-long-password");
    await user.type(screen.getByLabelText("Repeat the new password"), "a-new-long-passw0rd");
    await user.click(screen.getByRole("button", { name: "Set new password" }));
    expect(await screen.findByText("The two passwords don't match")).toBeInTheDocument();
    expect(api.callsTo("POST /api/auth/reset")).toHaveLength(0);

    await user.clear(screen.getByLabelText("Repeat the new password"));
    await user.type(screen.getByLabelText("Repeat the new password"), "a-new-long-password");
    await user.click(screen.getByRole("button", { name: "Set new password" }));
    await waitFor(() => expect(router.state.location.pathname).toBe("/sign-in"));
    expect(api.callsTo("POST /api/auth/reset")[0]!.body).toEqual({ token: TOKEN, password: "a-new-long-password" });
    expect(api.callsTo("POST /api/auth/reset")[0]!.headers["x-csrf-token"]).toBe("csrf-9");
    expect(await screen.findByText("Your new password is set. Sign in with it.")).toBeInTheDocument();
  });

  it("explains an invalid or used link and offers to ask again", async () => {
    stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "csrf-9" }),
      "POST /api/auth/reset": () =>
        json(400, { error: { code: "invalid_reset_token", message: "That reset link is not valid or has expired" } }),
    });
    const user = userEvent.setup();
    renderAt(`/reset-password?token=${TOKEN}`);
    await user.type(screen.getByLabelText("New password"), "a-new-long-password");
    await user.type(screen.getByLabelText("Repeat the new password"), "a-new-long-password");
    await user.click(screen.getByRole("button", { name: "Set new password" }));
    expect(await screen.findByRole("heading", { name: "This reset link doesn't work" })).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Ask for a new link" })).toHaveAttribute("href", "/forgot-password");
  });

  it("treats a missing token as an invalid link without calling the server", async () => {
    const api = stubApi({});
    renderAt("/reset-password");
    expect(await screen.findByRole("heading", { name: "This reset link doesn't work" })).toBeInTheDocument();
    expect(api.calls).toHaveLength(0);
  });
});
