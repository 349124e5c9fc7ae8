import { Link } from "react-router-dom";
import type { CustomerDto } from "@shared/schemas/customer";
import { cn } from "@/lib/cn";
import { paths } from "@/config/paths";
import { Button } from "@/components/ui/button";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { formatDateTime, formatShortDate } from "@/lib/format";

type Props = {
  customers: CustomerDto[];
  pendingId?: number | null;
  stale?: boolean;
  onEdit: (c: CustomerDto) => void;
  onArchive: (c: CustomerDto) => void;
  onRestore: (c: CustomerDto) => void;
};

const address = (c: CustomerDto) =>
  [c.addressLine1, c.addressLine2, [c.city, [c.region, c.postalCode].filter(Boolean).join(" ")].filter(Boolean).join(", ")]
    .filter(Boolean)
    .join(", ");

export function CustomersTable({ customers, pendingId, stale, onEdit, onArchive, onRestore }: Props) {
  return (
    <Table aria-label="Customers" aria-busy={stale || undefined} className={cn("transition-opacity", stale && "opacity-60")}>
      <THead>
        <tr>
          <Th>Name</Th>
          <Th>E-mail</Th>
          <Th className="hidden w-36 lg:table-cell">Phone</Th>
          <Th className="hidden lg:table-cell">Address</Th>
          <Th className="hidden w-32 xl:table-cell">Last change</Th>
          <Th className="text-right">
            <span className="sr-only">Actions</span>
          </Th>
        </tr>
      </THead>
      <TBody>
        {customers.map((c) => {
          const busy = pendingId === c.id;
          const where = address(c);
          return (
            <Tr key={c.id} className={cn(c.archivedAt && "text-steel-500")}>
              <Td className="whitespace-nowrap py-1.5 font-medium text-steel-900">
                {c.name}
                {c.archivedAt && <span className="ml-1.5 text-xs font-normal text-steel-500">(archived)</span>}
                {/* narrower screens: phone and town under the name instead of their own columns */}
                {(c.phone || c.city) && (
                  <span className="block text-xs font-normal tabular-nums text-steel-500 lg:hidden">
                    {[c.phone, c.city].filter(Boolean).join(" · ")}
                  </span>
                )}
              </Td>
              <Td className="max-w-[14rem] truncate py-1.5 text-steel-700 xl:max-w-[18rem]" title={c.email ?? undefined}>
                {c.email ?? (
                  <span className="inline-flex items-center gap-1 text-xs text-caution-700">
                    <svg viewBox="0 0 16 16" className="size-3.5" fill="currentColor" aria-hidden="true">
                      <path d="M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13ZM7.25 4.5h1.5v4.25h-1.5V4.5Zm0 5.75h1.5v1.5h-1.5v-1.5Z" />
                    </svg>
                    No e-mail
                  </span>
                )}
              </Td>
              <Td className="hidden whitespace-nowrap py-1.5 tabular-nums text-steel-700 lg:table-cell">
                {c.phone ?? <span className="text-steel-400">—</span>}
              </Td>
              <Td className="hidden max-w-[14rem] truncate py-1.5 text-steel-700 lg:table-cell xl:max-w-[20rem]" title={where || undefined}>
                {where || <span className="text-steel-400">No address</span>}
              </Td>
              <Td className="hidden whitespace-nowrap py-1.5 tabular-nums text-steel-600 xl:table-cell">
                <time dateTime={c.updatedAt} title={formatDateTime(c.updatedAt)}>
                  {formatShortDate(c.updatedAt)}
                </time>
              </Td>
              <Td className="whitespace-nowrap py-1 text-right">
                <div className="flex justify-end gap-1">
                  <Link
                    to={`${paths.jobs}?${new URLSearchParams({ q: c.name })}`}
                    className="inline-flex h-7 items-center rounded-md px-2.5 text-xs font-medium text-steel-700 hover:bg-steel-100 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
                    aria-label={`Jobs for ${c.name}`}
                  >
                    Jobs
                  </Link>
                  {!c.archivedAt && (
                    <Button variant="ghost" size="sm" disabled={busy} onClick={() => onEdit(c)} aria-label={`Edit ${c.name}`}>
                      Edit
                    </Button>
                  )}
                  {c.archivedAt ? (
                    <Button
                      variant="secondary"
                      size="sm"
                      loading={busy}
                      onClick={() => onRestore(c)}
                      aria-label={`Restore ${c.name}`}
                    >
                      Restore
                    </Button>
                  ) : (
                    <Button
                      variant="ghost"
                      size="sm"
                      disabled={busy}
                      className="text-danger-700 hover:bg-danger-50"
                      onClick={() => onArchive(c)}
                      aria-label={`Archive ${c.name}`}
                    >
                      Archive
                    </Button>
                  )}
                </div>
              </Td>
            </Tr>
          );
        })}
      </TBody>
    </Table>
  );
}
