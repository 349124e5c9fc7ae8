import { ROLES, type Role } from "@shared/auth/roles";

export const paths = {
  home: "/",
  signIn: "/sign-in",
  jobs: "/jobs",
  approvals: "/approvals",
  priceBook: "/price-book",
  team: "/team",
  account: "/account",
  customers: "/customers",
  company: "/company",
  devMail: "/dev/mail",
  forgotPassword: "/forgot-password",
  resetPassword: "/reset-password",
  /** The homeowner's proposal page (public, no sign-in). */
  proposalPublic: (token: string) => `/p/${encodeURIComponent(token)}`,
  job: (jobId: number | string) => `/jobs/${jobId}`,
  jobSection: (jobId: number | string, section: JobSection) => `/jobs/${jobId}/${section}`,
} as const;

/** The job workspace's sections, in order; the slug is the last part of the URL. */
export const JOB_SECTIONS = [
  { slug: "site", label: "Site" },
  { slug: "roof-sketch", label: "Roof sketch" },
  { slug: "layer-stack", label: "Layer stack" },
  { slug: "gap-study", label: "Gap study" },
  { slug: "takeoff", label: "Takeoff" },
  { slug: "pricing", label: "Pricing" },
  { slug: "proposal", label: "Proposal" },
  { slug: "files", label: "Files" },
  { slug: "log", label: "Log" },
] as const;
export type JobSection = (typeof JOB_SECTIONS)[number]["slug"];

/** Sections the crew may open (they never see prices or the office's working sections). */
export const CREW_SECTIONS: readonly JobSection[] = ["site", "roof-sketch", "takeoff", "files"];

/** Which roles may open each signed-in screen. The server refuses the same roles on the API. */
export const screenAccess = {
  jobs: ROLES,
  approvals: ["owner"],
  priceBook: ["owner", "estimator"],
  team: ["owner"],
  account: ROLES,
  customers: ["owner", "estimator"],
  company: ["owner"],
  devMail: ["owner", "estimator"],
} as const satisfies Record<string, readonly Role[]>;

export type Screen = keyof typeof screenAccess;

export const canOpen = (screen: Screen, role: Role) => (screenAccess[screen] as readonly Role[]).includes(role);

/** The main navigation, in order; each entry is shown only to the roles that may open it. */
export const mainNav: { screen: Screen; to: string; label: string }[] = [
  { screen: "jobs", to: paths.jobs, label: "Jobs" },
  { screen: "customers", to: paths.customers, label: "Customers" },
  { screen: "approvals", to: paths.approvals, label: "Approvals" },
  { screen: "priceBook", to: paths.priceBook, label: "Price book" },
  { screen: "team", to: paths.team, label: "Team" },
  { screen: "company", to: paths.company, label: "Company" },
];

/**
 * A `next` target from the query string, kept only when it is a path on this site
 * (no scheme, no `//host`, not the sign-in page itself); otherwise the jobs board.
 */
export function safeNext(raw: string | null | undefined): string {
  if (!raw || !raw.startsWith("/") || raw.startsWith("//") || raw.startsWith("/\\")) return paths.jobs;
  if (raw === paths.signIn || raw.startsWith(`${paths.signIn}?`) || raw.startsWith(`${paths.signIn}/`)) return paths.jobs;
  return raw;
}

export function signInPath(next?: string): string {
  if (!next || next === paths.home || safeNext(next) !== next) return paths.signIn;
  return `${paths.signIn}?${new URLSearchParams({ next })}`;
}
