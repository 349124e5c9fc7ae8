import { useRef } from "react";
import type { CompanyDto } from "@shared/schemas/price-book";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { toast } from "@/components/ui/toast";
import { errorMessage } from "@/lib/api-client";
import { useCompanyLogo } from "@/features/company/api/queries";

const ACCEPT = "image/png,image/jpeg,image/webp";

/** The logo printed at the top of every proposal: PNG, JPEG or WebP up to 2 MB, resized by the server. */
export function LogoField({ company, canEdit }: { company: CompanyDto; canEdit: boolean }) {
  const input = useRef<HTMLInputElement>(null);
  const { upload, remove } = useCompanyLogo();
  const error = upload.error ?? remove.error;
  return (
    <div className="mt-3 space-y-2">
      <div className="flex items-start gap-3">
        {company.logoUrl ? (
          <img src={company.logoUrl} alt={`${company.name} logo`} className="h-14 max-w-48 rounded-md border border-steel-200 bg-white object-contain p-1" />
        ) : (
          <div
            aria-hidden="true"
            className="flex size-14 shrink-0 items-center justify-center rounded-md border border-dashed border-steel-300 bg-steel-50 text-lg font-semibold text-steel-400"
          >
            {company.name.slice(0, 1).toUpperCase()}
          </div>
        )}
        <p className="text-sm text-steel-600">
          {company.logoUrl
            ? "Printed at the top of every proposal."
            : "No logo yet: proposals print your trading name in its place."}{" "}
          PNG, JPEG or WebP, up to 2 MB; a wide logo prints best.
        </p>
      </div>
      {canEdit && (
        <div className="flex flex-wrap gap-2">
          <input
            ref={input}
            type="file"
            accept={ACCEPT}
            className="sr-only"
            aria-label="Choose a logo image"
            onChange={(e) => {
              const file = e.target.files?.[0];
              e.target.value = "";
              if (!file) return;
              upload.mutate(file, { onSuccess: () => toast.success("Logo saved") });
            }}
          />
          <Button type="button" variant="secondary" size="sm" disabled={upload.isPending} onClick={() => input.current?.click()}>
            {upload.isPending ? "Uploading…" : company.logoUrl ? "Replace logo" : "Upload logo"}
          </Button>
          {company.logoUrl && (
            <Button type="button" variant="ghost" size="sm" disabled={remove.isPending} onClick={() => remove.mutate(undefined, { onSuccess: () => toast.success("Logo removed") })}>
              Remove
            </Button>
          )}
        </div>
      )}
      {error && <Alert tone="error">{errorMessage(error)}</Alert>}
    </div>
  );
}
