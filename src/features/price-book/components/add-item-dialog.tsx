import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { MATERIAL_KEYS } from "@shared/engine/materials";
import {
  CATALOG_CATEGORIES,
  MATERIAL_KEY_LIST,
  UNITS,
  catalogItemInputSchema,
  type CatalogItemFormValues,
  type CatalogItemInput,
} from "@shared/schemas/price-book";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";
import { toast } from "@/components/ui/toast";
import { useCreateItem } from "@/features/price-book/api/mutations";
import { categoryLabel } from "@/features/price-book/components/items-tab";
import { dollarsToCents, parseNumber } from "@/lib/money";

const EMPTY: CatalogItemFormValues = {
  sku: "",
  name: "",
  category: "panels",
  purchaseUnit: "ea",
  coverageUnit: "ea",
  packCoverage: 1,
  unitCostCents: undefined as unknown as number,
  wastePct: null,
  materialKey: null,
  attributes: {},
};

/** The owner adds one item; server refusals (SKU taken, key already priced) land on their fields. */
export function AddItemDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const create = useCreateItem();
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<CatalogItemFormValues, unknown, CatalogItemInput>({
    resolver: zodResolver(catalogItemInputSchema),
    defaultValues: EMPTY,
  });

  const close = () => {
    if (!isSubmitting) onClose();
  };

  const submit = handleSubmit(async (values) => {
    try {
      const item = await create.mutateAsync(values);
      toast.success(`${item.sku} added to the price book.`);
      reset(EMPTY);
      onClose();
    } catch (err) {
      if (err instanceof ApiError && err.fields) {
        for (const [name, message] of Object.entries(err.fields)) setError(name as keyof CatalogItemFormValues, { message });
        return;
      }
      setError("root", { message: errorMessage(err) });
    }
  });

  return (
    <Dialog
      open={open}
      onClose={close}
      busy={isSubmitting}
      className="max-w-2xl"
      title="Add price-book item"
      description="What you buy, how it is sold and what one unit covers. Link it to a takeoff material to price quotes with it."
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={isSubmitting}>
            Cancel
          </Button>
          <Button type="submit" form="add-item-form" loading={isSubmitting}>
            Add item
          </Button>
        </>
      }
    >
      <form id="add-item-form" onSubmit={submit} noValidate className="grid grid-cols-1 gap-3 sm:grid-cols-6">
        {errors.root?.message && (
          <Alert tone="error" className="sm:col-span-6">
            {errors.root.message}
          </Alert>
        )}
        <Field label="SKU" error={errors.sku?.message} className="sm:col-span-2">
          <Input data-autofocus autoComplete="off" {...register("sku")} />
        </Field>
        <Field label="Name" error={errors.name?.message} className="sm:col-span-4">
          <Input autoComplete="off" {...register("name")} />
        </Field>
        <Field
          label="Takeoff material"
          error={errors.materialKey?.message}
          hint="Quotes price this material with this item. Leave empty for items used on manual lines only."
          className="sm:col-span-4"
        >
          <Select
            {...register("materialKey", {
              setValueAs: (v: unknown) => (v === "" || v === null ? null : v),
              onChange: (e: { target: { value: string } }) => {
                const info = (MATERIAL_KEYS as Record<string, { category: string; unit: string }>)[e.target.value];
                if (!info) return;
                setValue("category", info.category as CatalogItemFormValues["category"]);
                setValue("purchaseUnit", info.unit as CatalogItemFormValues["purchaseUnit"]);
                setValue("coverageUnit", info.unit as CatalogItemFormValues["coverageUnit"]);
                setValue("packCoverage", 1);
              },
            })}
          >
            <option value="">None (manual lines only)</option>
            {MATERIAL_KEY_LIST.map((k) => (
              <option key={k} value={k}>
                {k} — {MATERIAL_KEYS[k].description}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Category" error={errors.category?.message} className="sm:col-span-2">
          <Select {...register("category")}>
            {CATALOG_CATEGORIES.map((c) => (
              <option key={c} value={c}>
                {categoryLabel(c)}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Sold by (purchase unit)" error={errors.purchaseUnit?.message} className="sm:col-span-2">
          <Select {...register("purchaseUnit")}>
            {UNITS.map((u) => (
              <option key={u} value={u}>
                {u}
              </option>
            ))}
          </Select>
        </Field>
        <Field
          label="Pack coverage"
          error={errors.packCoverage?.message}
          hint="Coverage units in one purchase unit"
          className="sm:col-span-2"
        >
          <Input inputMode="decimal" {...register("packCoverage", { setValueAs: parseNumber })} />
        </Field>
        <Field label="Coverage unit" error={errors.coverageUnit?.message} className="sm:col-span-2">
          <Select {...register("coverageUnit")}>
            {UNITS.map((u) => (
              <option key={u} value={u}>
                {u}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Cost per purchase unit ($)" error={errors.unitCostCents?.message} className="sm:col-span-3">
          <Input inputMode="decimal" placeholder="0.00" {...register("unitCostCents", { setValueAs: dollarsToCents })} />
        </Field>
        <Field
          label="Waste (%)"
          error={errors.wastePct?.message}
          hint="Empty: the takeoff's own allowance"
          className="sm:col-span-3"
        >
          <Input inputMode="decimal" placeholder="default" {...register("wastePct", { setValueAs: parseNumber })} />
        </Field>
      </form>
    </Dialog>
  );
}
