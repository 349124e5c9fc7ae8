export const ROLES = ["owner", "estimator", "crew"] as const;
export type Role = (typeof ROLES)[number];

/** Roles that see prices, costs and margins. Crew never do. */
export const PRICING_ROLES: readonly Role[] = ["owner", "estimator"];

export const canSeePricing = (role: Role) => PRICING_ROLES.includes(role);
