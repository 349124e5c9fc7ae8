import { beforeEach, describe, expect, it, vi } from "vitest";
import { render, screen, waitFor } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { ApiError, resetCsrfToken } from "@/lib/api-client";
import { login, useLogin } from "@/features/auth/api/mutations";
import { SignInForm } from "@/features/auth/components/sign-in-form";
import { json, stubApi } from "./fetch-stub";

const DEMO_USER = { id: 1, email: "owner@example.com", name: "Dana Example", role: "owner", companyId: 1 };

function fill(user: ReturnType<typeof userEvent.setup>, email: string, password: string) {
  return (async () => {
    if (email) await user.type(screen.getByLabelText("E-mail"), email);
    if (password) await user.type(screen.getByLabelText("Password"), password);
  })();
}

beforeEach(() => {
  resetCsrfToken();
});

describe("SignInForm", () => {
  it("renders an e-mail field, a password field and a sign-in button", () => {
    render(<SignInForm onSubmit={vi.fn()} />);
    expect(screen.getByLabelText("E-mail")).toHaveAttribute("type", "email");
    expect(screen.getByLabelText("Password")).toHaveAttribute("type", "password");
    expect(screen.getByRole("button", { name: "Sign in" })).toBeEnabled();
  });

  it("submitting empty shows Required on both fields and sends nothing", async () => {
    const api = stubApi({}); // any request would be unhandled
    const onSubmit = vi.fn();
    const user = userEvent.setup();
    render(<SignInForm onSubmit={onSubmit} />);

    await user.click(screen.getByRole("button", { name: "Sign in" }));

    const email = screen.getByLabelText("E-mail");
    const password = screen.getByLabelText("Password");
    await waitFor(() => expect(email).toHaveAccessibleDescription("Required"));
    expect(password).toHaveAccessibleDescription("Required");
    expect(email).toHaveAttribute("aria-invalid", "true");
    expect(password).toHaveAttribute("aria-invalid", "true");
    expect(screen.getAllByText("Required")).toHaveLength(2);
    expect(onSubmit).not.toHaveBeenCalled();
    expect(api.calls).toHaveLength(0);
  });

  it("a malformed e-mail shows the e-mail message and does not submit", async () => {
    const onSubmit = vi.fn();
    const user = userEvent.setup();
    render(<SignInForm onSubmit={onSubmit} />);

    await fill(user, "owner@example", "ridgewright-demo");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    await waitFor(() =>
      expect(screen.getByLabelText("E-mail")).toHaveAccessibleDescription("Enter a valid e-mail address"),
    );
    expect(screen.getByLabelText("Password")).not.toHaveAttribute("aria-invalid");
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it("a valid submit passes the parsed values (e-mail trimmed and lower-cased) to onSubmit", async () => {
    const onSubmit = vi.fn().mockResolvedValue(undefined);
    const user = userEvent.setup();
    render(<SignInForm onSubmit={onSubmit} />);

    await fill(user, "  Owner@Example.com ", "ridgewright-demo");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit).toHaveBeenCalledWith({ email: "owner@example.com", password: "ridgewright-demo" });
  });

  it("shows 'Signing in…' and disables the button while the request runs", async () => {
    let finish!: () => void;
    const onSubmit = vi.fn(() => new Promise<void>((resolve) => (finish = resolve)));
    const user = userEvent.setup();
    render(<SignInForm onSubmit={onSubmit} />);

    await fill(user, "owner@example.com", "ridgewright-demo");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    const busy = await screen.findByRole("button", { name: /Signing in/ });
    expect(busy).toBeDisabled();
    finish();
    await waitFor(() => expect(screen.getByRole("button", { name: "Sign in" })).toBeEnabled());
  });

  it("a server 400 with field errors puts each message on its field", async () => {
    const onSubmit = vi
      .fn()
      .mockRejectedValue(
        new ApiError(400, "bad_request", "Please check the highlighted fields", { email: "Use your work address" }),
      );
    const user = userEvent.setup();
    render(<SignInForm onSubmit={onSubmit} />);

    await fill(user, "owner@example.com", "ridgewright-demo");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    await waitFor(() => expect(screen.getByLabelText("E-mail")).toHaveAccessibleDescription("Use your work address"));
    expect(screen.getByLabelText("E-mail")).toHaveAttribute("aria-invalid", "true");
    expect(screen.queryByRole("alert")).not.toBeInTheDocument();
  });

  it("a 401 shows one message above the form, not on a field", async () => {
    const onSubmit = vi.fn().mockRejectedValue(new ApiError(401, "invalid_credentials", "Wrong e-mail or password"));
    const user = userEvent.setup();
    render(<SignInForm onSubmit={onSubmit} />);

    await fill(user, "owner@example.com", "not-the-password");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    const alert = await screen.findByRole("alert");
    expect(alert).toHaveTextContent("That e-mail and password don't match an active account");
    expect(screen.getByLabelText("E-mail")).not.toHaveAttribute("aria-invalid");
    expect(screen.getByLabelText("Password")).not.toHaveAttribute("aria-invalid");
  });

  it("a 429 tells the user to wait", async () => {
    const onSubmit = vi.fn().mockRejectedValue(new ApiError(429, "rate_limited", "Too many requests"));
    const user = userEvent.setup();
    render(<SignInForm onSubmit={onSubmit} />);

    await fill(user, "owner@example.com", "not-the-password");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    expect(await screen.findByRole("alert")).toHaveTextContent("Too many failed sign-in attempts. Wait 15 minutes");
  });
});

describe("SignInForm through the API client (fetch stubbed)", () => {
  it("posts the values to /api/auth/login with the session's CSRF token", async () => {
    const api = stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "csrf-token-1" }),
      "POST /api/auth/login": () => json(200, { user: DEMO_USER }),
    });
    const onSignedIn = vi.fn();
    const user = userEvent.setup();
    render(<SignInForm onSubmit={(values) => login(values).then(onSignedIn)} />);

    await fill(user, "owner@example.com", "ridgewright-demo");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    await waitFor(() => expect(onSignedIn).toHaveBeenCalledWith(DEMO_USER));
    const [post] = api.callsTo("POST /api/auth/login");
    expect(post).toBeDefined();
    expect(post!.body).toEqual({ email: "owner@example.com", password: "ridgewright-demo" });
    expect(post!.headers["x-csrf-token"]).toBe("csrf-token-1");
    expect(post!.headers["content-type"]).toBe("application/json");
    expect(post!.credentials).toBe("same-origin");
  });

  it("a server 400 with fields lands on the field", async () => {
    stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/auth/login": () =>
        json(400, {
          error: { code: "bad_request", message: "Please check the highlighted fields", fields: { password: "Too long" } },
        }),
    });
    const user = userEvent.setup();
    render(<SignInForm onSubmit={login} />);

    await fill(user, "owner@example.com", "ridgewright-demo");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    await waitFor(() => expect(screen.getByLabelText("Password")).toHaveAccessibleDescription("Too long"));
  });

  it("with useLogin, a 401 shows the message and no toast-worthy error escapes", async () => {
    stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/auth/login": () =>
        json(401, { error: { code: "invalid_credentials", message: "E-mail or password is wrong" } }),
    });
    const qc = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
    function Harness() {
      const loginMutation = useLogin();
      return <SignInForm onSubmit={loginMutation.mutateAsync} />;
    }
    const user = userEvent.setup();
    render(
      <QueryClientProvider client={qc}>
        <Harness />
      </QueryClientProvider>,
    );

    await fill(user, "owner@example.com", "wrong-password");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    expect(await screen.findByRole("alert")).toHaveTextContent("don't match an active account");
    expect(screen.getByRole("button", { name: "Sign in" })).toBeEnabled();
    expect(qc.getMutationCache().getAll()[0]?.meta?.handlesError).toBe(true);
  });
});
