/** The job's saved roof and takeoff: one key factory and the queries the roof, takeoff and jobs features share. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import type { RoofDto } from "@shared/schemas/roof";
import type { TakeoffResult } from "@shared/engine/types";
import { api } from "@/lib/api-client";

export const roofKeys = {
  all: ["roof"] as const,
  detail: (jobId: number) => [...roofKeys.all, jobId] as const,
  takeoff: (jobId: number) => [...roofKeys.all, jobId, "takeoff"] as const,
};

/** The saved takeoff as the server stores it (the engine's result for the saved roof). */
export type StoredTakeoff = TakeoffResult;

export const roofQueries = {
  detail: (jobId: number) =>
    queryOptions({
      queryKey: roofKeys.detail(jobId),
      queryFn: ({ signal }) => api<{ data: RoofDto }>(`/jobs/${jobId}/roof`, { signal }).then((r) => r.data),
    }),
  takeoff: (jobId: number) =>
    queryOptions({
      queryKey: roofKeys.takeoff(jobId),
      queryFn: ({ signal }) =>
        api<{ data: StoredTakeoff | null }>(`/jobs/${jobId}/takeoff`, { signal }).then((r) => r.data),
    }),
};

export const useRoof = (jobId: number) => useQuery(roofQueries.detail(jobId));
export const useStoredTakeoff = (jobId: number) => useQuery(roofQueries.takeoff(jobId));
