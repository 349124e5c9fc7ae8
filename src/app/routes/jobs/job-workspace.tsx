import { lazy, Suspense, type ComponentType } from "react";
import { Navigate, NavLink, useParams } from "react-router-dom";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { LoadFailed } from "@/components/ui/load-failed";
import { Spinner } from "@/components/ui/spinner";
import { NotFoundRoute } from "@/app/routes/not-found";
import { CREW_SECTIONS, JOB_SECTIONS, paths, type JobSection } from "@/config/paths";
import { useMe } from "@/lib/auth";
import { cn } from "@/lib/cn";
import { canSeePricing } from "@shared/auth/roles";
import { ApiError } from "@/lib/api-client";
import { useJob } from "@/lib/queries/jobs";
import { JobHeader, JobHeaderSkeleton } from "@/features/jobs/components/job-header";

type SectionComponent = ComponentType<{ jobId: number }>;
const section = (load: () => Promise<SectionComponent>) => lazy(() => load().then((Component) => ({ default: Component })));

/** Each section is its own chunk: the sketch editor and the charts load only when opened. */
const SECTIONS: Record<JobSection, SectionComponent> = {
  site: section(() => import("@/features/jobs/components/site-section").then((m) => m.SiteSection)),
  "roof-sketch": section(() => import("@/features/roof/components/roof-sketch-section").then((m) => m.RoofSketchSection)),
  "layer-stack": section(() => import("@/features/roof/components/layer-stack-section").then((m) => m.LayerStackSection)),
  "gap-study": section(() => import("@/features/roof/components/gap-study-section").then((m) => m.GapStudySection)),
  takeoff: section(() => import("@/app/routes/jobs/job-takeoff").then((m) => m.JobTakeoffSection)),
  pricing: section(() => import("@/features/quotes/components/pricing-section").then((m) => m.PricingSection)),
  proposal: section(() => import("@/features/proposals/components/proposal-section").then((m) => m.ProposalSection)),
  files: section(() => import("@/app/routes/jobs/job-files").then((m) => m.JobFilesSection)),
  log: section(() => import("@/features/jobs/components/job-log-section").then((m) => m.JobLogSection)),
};

const isSection = (s: string | undefined): s is JobSection => JOB_SECTIONS.some((x) => x.slug === s);

/** `/jobs/:jobId/:section`: the job workspace, one section at a time, named in the URL. */
export function JobWorkspaceRoute() {
  const { jobId: rawId, section: rawSection } = useParams();
  const { data: me } = useMe();
  const jobId = Number(rawId);
  const validId = Number.isInteger(jobId) && jobId > 0;
  const job = useJob(jobId, validId);
  if (!validId) return <NotFoundRoute />;
  if (job.error instanceof ApiError && job.error.status === 404) return <NotFoundRoute />;
  if (!rawSection) return <Navigate to={paths.jobSection(jobId, "site")} replace />;
  if (!isSection(rawSection)) return <NotFoundRoute />;
  const visible = me?.role === "crew" ? JOB_SECTIONS.filter((s) => CREW_SECTIONS.includes(s.slug)) : JOB_SECTIONS;
  if (!visible.some((s) => s.slug === rawSection)) return <Navigate to={paths.jobSection(jobId, "site")} replace />;
  const Section = SECTIONS[rawSection];
  const sectionLabel = JOB_SECTIONS.find((s) => s.slug === rawSection)?.label ?? "";
  return (
    <div className="space-y-3">
      <title>{`${job.data ? `${job.data.customer.name || `Job ${jobId}`} · ` : ""}${sectionLabel} · Ridgewright`}</title>
      {job.data ? (
        <JobHeader job={job.data} showQuoteTotal={me ? canSeePricing(me.role) : false} />
      ) : job.isError ? (
        <LoadFailed title="The job could not be loaded" error={job.error} onRetry={() => job.refetch()} />
      ) : (
        <JobHeaderSkeleton />
      )}
      <nav aria-label="Job sections" className="flex flex-wrap gap-1 border-b border-steel-200">
        {visible.map((s) => (
          <NavLink
            key={s.slug}
            to={paths.jobSection(jobId, s.slug)}
            className={({ isActive }) =>
              cn(
                "-mb-px rounded-t-md border-b-2 px-3 py-2 text-sm font-medium focus-visible:outline focus-visible:outline-2 focus-visible:outline-accent-600",
                isActive ? "border-accent-700 text-steel-900" : "border-transparent text-steel-600 hover:text-steel-900",
              )
            }
          >
            {s.label}
          </NavLink>
        ))}
      </nav>
      <ErrorBoundary key={rawSection}>
        <Suspense fallback={<Spinner label="Loading section" />}>
          <Section jobId={jobId} />
        </Suspense>
      </ErrorBoundary>
    </div>
  );
}
