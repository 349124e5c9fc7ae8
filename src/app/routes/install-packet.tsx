import { Link, useParams } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { LoadFailed } from "@/components/ui/load-failed";
import { Spinner } from "@/components/ui/spinner";
import { NotFoundRoute } from "@/app/routes/not-found";
import { paths } from "@/config/paths";
import { useMe } from "@/lib/auth";
import { installPacketPdfUrl, useInstallPacket } from "@/features/install-packet/api/queries";
import { InstallPacketView } from "@/features/install-packet/components/install-packet-view";
import { ApiError, errorMessage } from "@/lib/api-client";

/**
 * Print rules for this page only (the page marks itself with data-install-packet): the app's top bar,
 * the toolbar and links are hidden, each area starts a new sheet, and plane blocks are not split.
 */
const PRINT_CSS = `
@media print {
  @page { size: letter; margin: 12mm 12mm 14mm; }
  body:has([data-install-packet]) a[href="#main"],
  body:has([data-install-packet]) header:has(~ main#main) { display: none !important; }
  body:has([data-install-packet]) main#main { max-width: none; padding: 0; }
  [data-install-packet] [data-print-hide] { display: none !important; }
  [data-install-packet] { font-size: 10.5pt; color: #000; }
  [data-install-packet] .packet-break { break-before: page; }
  [data-install-packet] .packet-keep { break-inside: avoid; }
  [data-install-packet] h2, [data-install-packet] h3, [data-install-packet] h4 { break-after: avoid; }
  [data-install-packet] img { max-height: 2.2in; }
}`;

const linkClass =
  "inline-flex h-8 items-center gap-1.5 rounded-md px-3 text-sm font-medium focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500";

/** `/jobs/:jobId/packet`: the crew's install packet as a printable page, with the PDF beside it. */
export function InstallPacketRoute() {
  const { jobId: rawId } = useParams();
  const jobId = Number(rawId);
  const validId = Number.isInteger(jobId) && jobId > 0;
  const packet = useInstallPacket(jobId, validId);
  const { data: me } = useMe();
  if (!validId) return <NotFoundRoute />;
  if (packet.error instanceof ApiError && packet.error.status === 404) return <NotFoundRoute />;
  const noRoof = packet.error instanceof ApiError && packet.error.code === "no_roof";

  return (
    <div data-install-packet className="mx-auto max-w-5xl space-y-4">
      <title>{`Install packet · Job ${jobId} · Ridgewright`}</title>
      <style>{PRINT_CSS}</style>
      <div data-print-hide className="flex flex-wrap items-center justify-between gap-2 border-b border-steel-200 pb-3">
        <Link
          to={paths.jobSection(jobId, "files")}
          className="inline-flex items-center gap-1 rounded text-xs font-medium text-steel-600 hover:text-accent-700 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
        >
          <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
            <path d="m10 3.5-4.5 4.5 4.5 4.5" strokeLinecap="round" strokeLinejoin="round" />
          </svg>
          Back to the job
        </Link>
        {packet.data && (
          <div className="flex flex-wrap gap-2">
            <a href={installPacketPdfUrl(jobId)} download className={`${linkClass} bg-accent-700 text-white shadow-sm hover:bg-accent-800`}>
              Download PDF
            </a>
            <Button variant="secondary" onClick={() => window.print()}>
              Print
            </Button>
          </div>
        )}
      </div>

      {packet.data ? (
        <InstallPacketView doc={packet.data} />
      ) : noRoof ? (
        <Alert tone="caution" title="No install packet yet">
          <p>{errorMessage(packet.error)}</p>
          {me && me.role !== "crew" && (
            <Link to={paths.jobSection(jobId, "roof-sketch")} className="mt-1 inline-block font-medium text-accent-700 underline underline-offset-2">
              Open the roof sketch
            </Link>
          )}
        </Alert>
      ) : packet.isError ? (
        <LoadFailed title="The install packet could not be loaded" error={packet.error} onRetry={() => packet.refetch()} />
      ) : (
        <Spinner label="Loading the install packet" />
      )}
    </div>
  );
}
