import { errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { PageHeader } from "@/components/layout/page-header";
import { useCompany } from "@/lib/queries/company";
import { CompanyProfileForm } from "@/features/company/components/company-profile-form";

/** The owner's company profile: what proposals print about the business. */
export function CompanyRoute() {
  const company = useCompany();
  return (
    <>
      <title>Company · Ridgewright</title>
      <PageHeader title="Company" description="The details, terms and numbering printed on your proposals." />
      {company.isPending ? (
        <div className="flex items-center gap-2 py-10 text-steel-500">
          <Spinner label="Loading company profile" /> <span>Loading…</span>
        </div>
      ) : company.isError ? (
        <Alert tone="error" title="The company profile could not be loaded">
          <p>{errorMessage(company.error)}</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => company.refetch()}>
            Try again
          </Button>
        </Alert>
      ) : (
        <CompanyProfileForm company={company.data} />
      )}
    </>
  );
}
