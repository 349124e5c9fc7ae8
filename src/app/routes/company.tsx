import { LoadFailed } from "@/components/ui/load-failed";
import { LoadingRow } from "@/components/ui/spinner";
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
        <LoadingRow label="Loading company profile" />
      ) : company.isError ? (
        <LoadFailed title="The company profile could not be loaded" error={company.error} onRetry={() => company.refetch()} />
      ) : (
        <CompanyProfileForm company={company.data} />
      )}
    </>
  );
}
