import { beforeEach, describe, expect, it, vi } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import type { UserDto } from "@shared/schemas/auth";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { useCreateJob } from "@/features/jobs/api/mutations";
import { CustomerFields } from "@/features/customers/components/customer-fields";
import { CustomerPicker } from "@/features/customers/components/customer-picker";
import { NewJobForm } from "@/features/jobs/components/new-job-form";
import { json, stubApi } from "./fetch-stub";
import { customer, estimator, jobDetail, owner, page, team } from "./jobs-fixtures";

/** The form wired to the real create mutation (fetch stubbed), as the board uses it. */
function renderForm(me: UserDto = estimator) {
  const qc = makeAppQueryClient();
  const created = vi.fn();
  function Harness() {
    const create = useCreateJob();
    return (
      <NewJobForm
        me={me}
        customerInputs={{ Picker: CustomerPicker, Fields: CustomerFields }}
        onCancel={() => undefined}
        onSubmit={async (values) => created(await create.mutateAsync(values))}
      />
    );
  }
  render(
    <QueryClientProvider client={qc}>
      <Harness />
    </QueryClientProvider>,
  );
  return { created };
}

const badRequest = (fields: Record<string, string>) =>
  json(400, { error: { code: "bad_request", message: "Please check the highlighted fields", fields } });

beforeEach(() => {
  resetCsrfToken();
});

describe("new job form: validation", () => {
  it("without a customer it says so on the customer field and sends nothing", async () => {
    const api = stubApi({});
    renderForm();
    await userEvent.setup().click(screen.getByRole("button", { name: "Create job" }));

    const picker = screen.getByRole("combobox", { name: "Find the customer" });
    await waitFor(() => expect(picker).toHaveAccessibleDescription("Pick a customer or add a new one"));
    expect(picker).toHaveAttribute("aria-invalid", "true");
    expect(api.calls).toHaveLength(0);
  });

  it("a new customer needs a name and a valid e-mail", async () => {
    const api = stubApi({});
    renderForm();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "New customer" }));
    await user.type(screen.getByLabelText("E-mail"), "not-an-address");
    await user.click(screen.getByRole("button", { name: "Create job" }));

    await waitFor(() => expect(screen.getByLabelText("Name")).toHaveAccessibleDescription("Required"));
    expect(screen.getByLabelText("E-mail")).toHaveAccessibleDescription(
      expect.stringContaining("Enter a valid e-mail address"),
    );
    expect(api.calls).toHaveLength(0);
  });

  it("bad site data opens the collapsed site panel and shows the messages on its fields", async () => {
    stubApi({});
    renderForm();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "New customer" }));
    await user.type(screen.getByLabelText("Name"), "Ada Quarry");
    // the panel is collapsed; open it, give an impossible zone and a negative wind speed, close it again
    await user.click(screen.getByText("Site data for the takeoff"));
    await user.type(screen.getByLabelText("Climate zone"), "9z");
    await user.type(screen.getByLabelText("Basic wind speed (mph)"), "-5");
    await user.click(screen.getByText("Site data for the takeoff"));
    await user.click(screen.getByRole("button", { name: "Create job" }));

    await waitFor(() =>
      expect(screen.getByLabelText("Climate zone")).toHaveAccessibleDescription(
        expect.stringContaining('Use an IECC climate zone such as "3A"'),
      ),
    );
    expect(screen.getByLabelText("Basic wind speed (mph)")).toHaveAccessibleDescription("Must not be negative");
    expect(screen.getByText("Check these fields")).toBeInTheDocument();
    await waitFor(() => expect(screen.getByLabelText("Climate zone").closest("details")).toHaveAttribute("open"));
  });
});

describe("new job form: submitting", () => {
  it("posts a picked customer's id with the site defaults, not a new customer", async () => {
    const api = stubApi({
      "GET /api/customers": (call) =>
        json(200, page(call.path.includes("q=quarry") ? [customer(41, { name: "Ada Quarry" })] : [customer(41, { name: "Ada Quarry" }), customer(42)])),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/jobs": () => json(201, { data: jobDetail(90, { customerId: 41 }) }),
    });
    const { created } = renderForm();
    const user = userEvent.setup();

    await user.type(screen.getByRole("combobox", { name: "Find the customer" }), "quarry");
    const list = await screen.findByRole("listbox", { name: "Customers" });
    await waitFor(() => expect(within(list).getAllByRole("option")).toHaveLength(2)); // Ada, and "add new"
    await user.keyboard("{Enter}"); // the first match is active
    expect(screen.getByText("Ada Quarry")).toBeInTheDocument();
    await user.type(within(screen.getByRole("region", { name: "Site address" })).getByLabelText("Street address"), "14 Quarry Lane");
    await user.click(screen.getByRole("button", { name: "Create job" }));

    await waitFor(() => expect(created).toHaveBeenCalledTimes(1));
    const body = api.callsTo("POST /api/jobs")[0]!.body as Record<string, unknown>;
    expect(body.customerId).toBe(41);
    expect(body).not.toHaveProperty("customer");
    expect(body.siteAddressLine1).toBe("14 Quarry Lane");
    expect(body.site).toMatchObject({
      atticType: "vented",
      codeEdition: 2021,
      existingLayers: 1,
      tearOff: true,
      coolRoofRequired: false,
      wind: { ratedAssemblyRequired: false },
    });
    expect(api.callsTo("GET /api/customers").every((c) => !c.path.includes("archived=1"))).toBe(true);
  });

  it("server field errors land on their fields, inside the customer and the site data too", async () => {
    stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/jobs": () =>
        badRequest({
          "customer.email": "This address bounced last time",
          "site.wind.meanRoofHeightFt": "Must be more than 0",
          siteCity: "Use at most 80 characters",
        }),
    });
    const { created } = renderForm();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "New customer" }));
    await user.type(screen.getByLabelText("Name"), "Ada Quarry");
    await user.type(screen.getByLabelText("E-mail"), "ada@example.com");
    await user.click(screen.getByRole("button", { name: "Create job" }));

    await waitFor(() =>
      expect(screen.getByLabelText("E-mail")).toHaveAccessibleDescription(
        expect.stringContaining("This address bounced last time"),
      ),
    );
    const siteAddress = within(screen.getByRole("region", { name: "Site address" }));
    expect(siteAddress.getByLabelText("City")).toHaveAccessibleDescription("Use at most 80 characters");
    const customerPart = within(screen.getByRole("region", { name: "Customer" }));
    expect(customerPart.getByLabelText("City")).not.toHaveAttribute("aria-invalid");
    expect(screen.getByLabelText("Mean roof height (ft)")).toHaveAccessibleDescription("Must be more than 0");
    await waitFor(() => expect(screen.getByLabelText("Mean roof height (ft)").closest("details")).toHaveAttribute("open"));
    // nothing typed is lost
    expect(screen.getByLabelText("Name")).toHaveValue("Ada Quarry");
    expect(created).not.toHaveBeenCalled();
  });

  it("an error that belongs to no field is shown above the form", async () => {
    stubApi({
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/jobs": () => json(503, { error: { code: "unavailable", message: "The database is not answering; try again shortly" } }),
    });
    renderForm();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "New customer" }));
    await user.type(screen.getByLabelText("Name"), "Ada Quarry");
    await user.click(screen.getByRole("button", { name: "Create job" }));
    expect(await screen.findByRole("alert")).toHaveTextContent("The database is not answering");
  });

  it("an owner can assign the estimator; the id is sent as a number", async () => {
    const api = stubApi({
      "GET /api/users": () => json(200, { data: team }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "POST /api/jobs": () => json(201, { data: jobDetail(91) }),
    });
    renderForm(owner);
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "New customer" }));
    await user.type(screen.getByLabelText("Name"), "Ada Quarry");
    const select = screen.getByLabelText("Estimator");
    await waitFor(() => expect(within(select).getAllByRole("option").length).toBe(3)); // unassigned, owner, estimator (no crew)
    await user.selectOptions(select, String(estimator.id));
    await user.click(screen.getByRole("button", { name: "Create job" }));

    await waitFor(() => expect(api.callsTo("POST /api/jobs")).toHaveLength(1));
    const body = api.callsTo("POST /api/jobs")[0]!.body as Record<string, unknown>;
    expect(body.estimatorId).toBe(estimator.id);
    expect(body.customer).toMatchObject({ name: "Ada Quarry" });
    expect(body).not.toHaveProperty("customerId");
  });
});
