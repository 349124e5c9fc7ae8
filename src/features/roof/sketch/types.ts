export type Tool = "select" | "draw";

/** What is selected on the plan: a plane, one of its edges (edge i runs from corner i to i + 1), or a corner. */
export type Selection =
  | { kind: "plane"; planeId: string }
  | { kind: "edge"; planeId: string; edge: number }
  | { kind: "vertex"; planeId: string; index: number }
  | null;
