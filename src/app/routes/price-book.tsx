import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/layout/page-header";
import { useMe } from "@/features/auth/api/queries";

/** The company price book (placeholder). Owners will edit it; estimators read it. */
export function PriceBookRoute() {
  const { data: me } = useMe();
  const owner = me?.role === "owner";
  return (
    <>
      <title>Price book · Ridgewright</title>
      <PageHeader
        title="Price book"
        description={owner ? "Your unit costs, pack sizes, labour rates and pricing settings." : "Your company's unit costs and labour rates (read-only)."}
      />
      <EmptyState
        icon={
          <svg viewBox="0 0 48 48" className="size-12" fill="none" stroke="currentColor" strokeWidth="1.5">
            <path d="M12 8h20l6 6v26H12z" strokeLinejoin="round" />
            <path d="M32 8v6h6M18 20h14M18 26h14M18 32h9" strokeLinecap="round" />
          </svg>
        }
        title="The price book is on its way"
        description={
          owner
            ? "You'll keep panels, trim, fasteners, underlayment and labour rates here, with the markup, margin and tax your quotes use. It arrives in an upcoming release."
            : "You'll look up the unit costs and labour rates your owner keeps here. It arrives in an upcoming release."
        }
      />
    </>
  );
}
