/** The company's team: one key factory and the list the Team screen and the jobs' estimator pickers share. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import type { TeamMemberDto } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

export const userKeys = {
  all: ["users"] as const,
  list: () => [...userKeys.all, "list"] as const,
};

export const userQueries = {
  list: () =>
    queryOptions({
      queryKey: userKeys.list(),
      queryFn: ({ signal }) => api<{ data: TeamMemberDto[] }>("/users", { signal }).then((r) => r.data),
    }),
};

export const useTeamMembers = () => useQuery(userQueries.list());
