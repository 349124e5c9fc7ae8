import { PlaneImport } from "@/features/roof/components/plane-import";
import { FilesSection } from "@/features/uploads/components/files-section";

/**
 * The job workspace's Files section: the job's files, with the roof-plane import from a CSV below them for
 * the office (the import saves a new roof version, so it belongs to the roof; the screen puts them together).
 */
export function JobFilesSection({ jobId }: { jobId: number }) {
  return <FilesSection jobId={jobId} officeTools={<PlaneImport jobId={jobId} />} />;
}
