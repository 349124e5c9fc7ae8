/** The edge types of a roof plane's outline. */
export const EDGE_TYPES = ["eave", "rake", "ridge", "hip", "valley", "transition", "sidewall", "headwall"] as const;
export type EdgeType = (typeof EDGE_TYPES)[number];
