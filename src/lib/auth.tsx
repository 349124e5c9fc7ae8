/** The signed-in user (`GET /api/auth/me`): every feature reads it, to show or hide what a role may do. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import type { UserDto } from "@shared/schemas/auth";
import { api, ApiError } from "@/lib/api-client";

export const authKeys = {
  all: ["auth"] as const,
  /** The signed-in user, or `null` when signed out. */
  me: ["auth", "me"] as const,
};

/** The signed-in user from `GET /api/auth/me`; `null` on 401 (signed out), other errors thrown. */
export async function fetchMe(signal?: AbortSignal): Promise<UserDto | null> {
  try {
    const { user } = await api<{ user: UserDto }>("/auth/me", { signal });
    return user;
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const authQueries = {
  me: () =>
    queryOptions({
      queryKey: authKeys.me,
      queryFn: ({ signal }) => fetchMe(signal),
      staleTime: 5 * 60_000,
    }),
};

export const useMe = () => useQuery(authQueries.me());
