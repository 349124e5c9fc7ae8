import { JOB_STATUSES, MANUAL_STATUS_MOVES, type JobStatus } from "@shared/schemas/job";

export const STATUS_LABELS: Record<JobStatus, string> = {
  lead: "Lead",
  estimating: "Estimating",
  proposed: "Proposed",
  won: "Won",
  scheduled: "Scheduled",
  installed: "Installed",
  lost: "Lost",
};

export const STATUS_HINTS: Record<JobStatus, string> = {
  lead: "Not measured yet",
  estimating: "Roof measured; being priced",
  proposed: "Proposal sent to the homeowner",
  won: "Accepted; waiting for a date",
  scheduled: "Install date set",
  installed: "Roof installed",
  lost: "The homeowner went elsewhere, or the proposal lapsed",
};

/** The jobs still in play, for the board's "Open jobs" filter. */
export const OPEN_STATUSES: readonly JobStatus[] = ["lead", "estimating", "proposed", "won", "scheduled"];

export const isJobStatus = (s: string): s is JobStatus => (JOB_STATUSES as readonly string[]).includes(s);

/** The button text for a manual move from `from` to `to`. */
export function moveLabel(from: JobStatus, to: JobStatus): string {
  if (to === "lost") return "Mark lost";
  if (from === "lost") return `Reopen as ${STATUS_LABELS[to].toLowerCase()}`;
  if (from === "scheduled" && to === "won") return "Back to won (date fell through)";
  if (from === "installed" && to === "scheduled") return "Back to scheduled";
  return `Mark ${STATUS_LABELS[to].toLowerCase()}`;
}

/** The moves a person may make by hand from a status (the same table the server checks). */
export const manualMoves = (from: JobStatus): readonly JobStatus[] => MANUAL_STATUS_MOVES[from];
