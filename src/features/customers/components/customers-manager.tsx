import { useState } from "react";
import { useSearchParams } from "react-router-dom";
import type { CustomerDto } from "@shared/schemas/customer";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadFailed } from "@/components/ui/load-failed";
import { Pager } from "@/components/ui/pager";
import { Spinner } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { PageHeader } from "@/components/layout/page-header";
import { useCustomers } from "@/lib/queries/customers";
import { useCreateCustomer, useSetCustomerArchived, useUpdateCustomer } from "@/features/customers/api/mutations";
import { CustomerForm } from "@/features/customers/components/customer-form";
import { CustomersTable } from "@/features/customers/components/customers-table";
import {
  CUSTOMER_PAGE_SIZES,
  readCustomerList,
  writeCustomerList,
  type CustomerListState,
} from "@/features/customers/lib/customer-params";
import { SearchBox } from "@/components/ui/search-box";

/** The Customers screen: search, paging, live/archived, add and edit in a dialog, archive and restore. */
export function CustomersManager() {
  const [searchParams, setSearchParams] = useSearchParams();
  const state = readCustomerList(searchParams);
  const list = useCustomers({
    page: state.page,
    pageSize: state.pageSize,
    q: state.q.trim() || undefined,
    archived: state.archived ? "1" : undefined,
  });
  const createCustomer = useCreateCustomer();
  const updateCustomer = useUpdateCustomer();
  const setArchived = useSetCustomerArchived();

  const [adding, setAdding] = useState(false);
  const [editing, setEditing] = useState<CustomerDto | null>(null);
  const [archiving, setArchiving] = useState<CustomerDto | null>(null);

  const update = (changes: Partial<CustomerListState>, opts: { replace?: boolean } = {}) => {
    const resetPage = !("page" in changes);
    setSearchParams(writeCustomerList({ ...state, ...(resetPage ? { page: 1 } : {}), ...changes }), opts);
  };

  const archive = (c: CustomerDto, archived: boolean) =>
    setArchived.mutateAsync({ id: c.id, archived }).then(() => {
      toast.success(archived ? `${c.name} was archived.` : `${c.name} was restored.`);
    });

  const pendingId = setArchived.isPending ? setArchived.variables?.id : null;
  const data = list.data;

  return (
    <>
      <PageHeader
        title="Customers"
        description="The homeowners you quote for. Check the e-mail before a proposal goes out."
        actions={<Button onClick={() => setAdding(true)}>Add customer</Button>}
      />

      <div role="search" aria-label="Filter customers" className="mb-3 flex flex-wrap items-center gap-2">
        <SearchBox
          label="Search customers"
          placeholder="Name, e-mail, phone, street, city or ZIP"
          value={state.q}
          onSearch={(q) => update({ q }, { replace: true })}
          className="w-full sm:w-80"
        />
        <div role="group" aria-label="Show" className="inline-flex rounded-md border border-steel-300 bg-white p-0.5 shadow-sm">
          {[
            { archived: false, label: "Live" },
            { archived: true, label: "Archived" },
          ].map((o) => (
            <button
              key={o.label}
              type="button"
              aria-pressed={state.archived === o.archived}
              onClick={() => update({ archived: o.archived })}
              className={
                state.archived === o.archived
                  ? "h-6 rounded bg-steel-800 px-2.5 text-xs font-medium text-white focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
                  : "h-6 rounded px-2.5 text-xs font-medium text-steel-600 hover:bg-steel-100 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
              }
            >
              {o.label}
            </button>
          ))}
        </div>
        {list.isFetching && !list.isPending && (
          <span className="flex items-center gap-1.5 text-xs text-steel-500">
            <Spinner label="Updating" /> Updating…
          </span>
        )}
      </div>

      {list.isPending ? (
        <div className="flex items-center gap-2 rounded-lg border border-steel-200 bg-white px-4 py-10 text-steel-500 shadow-panel">
          <Spinner label="Loading customers" /> <span>Loading customers…</span>
        </div>
      ) : list.isError && !data ? (
        <LoadFailed title="The customers could not be loaded" error={list.error} onRetry={() => list.refetch()} />
      ) : data && data.data.length === 0 ? (
        <EmptyState
          title={state.q ? "No customers match" : state.archived ? "No archived customers" : "No customers yet"}
          description={
            state.q
              ? `Nothing matches “${state.q}”. Try part of the name, the street or the ZIP.`
              : state.archived
                ? "Archived customers are kept with their jobs and can be restored here."
                : "Add the homeowners you quote for, or add them as you create each job."
          }
          action={
            state.q ? (
              <Button variant="secondary" onClick={() => update({ q: "" })}>
                Clear search
              </Button>
            ) : !state.archived ? (
              <Button onClick={() => setAdding(true)}>Add customer</Button>
            ) : undefined
          }
        />
      ) : data ? (
        <div className="space-y-2">
          <CustomersTable
            customers={data.data}
            pendingId={pendingId}
            stale={list.isPlaceholderData}
            onEdit={setEditing}
            onArchive={setArchiving}
            onRestore={(c) => void archive(c, false).catch(() => undefined)}
          />
          <Pager
            page={state.page}
            pageSize={state.pageSize}
            total={data.meta.total}
            noun={data.meta.total === 1 ? "customer" : "customers"}
            onPage={(page) => update({ page })}
            pageSizes={CUSTOMER_PAGE_SIZES}
            onPageSize={(pageSize) => update({ pageSize })}
          />
        </div>
      ) : null}

      <Dialog
        open={adding}
        onClose={() => setAdding(false)}
        busy={createCustomer.isPending}
        title="Add customer"
        className="max-w-xl"
      >
        <CustomerForm
          submitLabel="Add customer"
          onCancel={() => setAdding(false)}
          onSubmit={async (values) => {
            const c = await createCustomer.mutateAsync(values);
            setAdding(false);
            toast.success(`${c.name} was added.`);
          }}
        />
      </Dialog>

      <Dialog
        open={editing !== null}
        onClose={() => setEditing(null)}
        busy={updateCustomer.isPending}
        title={`Edit ${editing?.name ?? "customer"}`}
        description="Changes apply to every job of this customer; proposals already sent keep what they said."
        className="max-w-xl"
      >
        {editing && (
          <CustomerForm
            customer={editing}
            submitLabel="Save changes"
            onCancel={() => setEditing(null)}
            onSubmit={async (values) => {
              const c = await updateCustomer.mutateAsync({ id: editing.id, changes: values });
              setEditing(null);
              toast.success(`${c.name} was saved.`);
            }}
          />
        )}
      </Dialog>

      <Dialog
        open={archiving !== null}
        onClose={() => setArchiving(null)}
        busy={setArchived.isPending}
        title={`Archive ${archiving?.name ?? ""}?`}
        description="They leave the customer list and can't be picked for new jobs. Their jobs stay as they are, and you can restore them from Archived at any time."
        footer={
          <>
            <Button variant="secondary" onClick={() => setArchiving(null)} disabled={setArchived.isPending}>
              Cancel
            </Button>
            <Button
              variant="danger"
              loading={setArchived.isPending}
              onClick={() => {
                const c = archiving;
                if (!c) return;
                void archive(c, true)
                  .catch(() => undefined)
                  .finally(() => setArchiving(null));
              }}
            >
              Archive
            </Button>
          </>
        }
      />
    </>
  );
}
