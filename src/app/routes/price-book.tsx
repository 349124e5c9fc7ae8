import { useMe } from "@/lib/auth";
import { PriceBookScreen } from "@/features/price-book/components/price-book-screen";

/** The company price book. Owners edit it; estimators read it (crew are stopped by the role gate). */
export function PriceBookRoute() {
  const { data: me } = useMe();
  return (
    <>
      <title>Price book · Ridgewright</title>
      <PriceBookScreen canEdit={me?.role === "owner"} />
    </>
  );
}
