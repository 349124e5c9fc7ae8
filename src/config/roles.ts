import type { Role } from "@shared/auth/roles";

export const ROLE_LABELS: Record<Role, string> = {
  owner: "Owner",
  estimator: "Estimator",
  crew: "Crew",
};

export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  owner: "Everything, plus price book, team and approvals",
  estimator: "Customers, jobs and quotes; reads the price book",
  crew: "Assigned jobs, install packets and photos",
};
