import { MutationCache, QueryCache, QueryClient } from "@tanstack/react-query";
import { ApiError } from "@/lib/api-client";

declare module "@tanstack/react-query" {
  interface Register {
    defaultError: Error;
    mutationMeta: {
      /** The form (or screen) that started the mutation shows its errors itself: no toast. */
      handlesError?: boolean;
    };
  }
}

const MAX_RETRIES = 2;

/** Retry network failures and 5xx answers (up to twice); never a 4xx, never an abort. */
export function shouldRetry(failureCount: number, error: unknown): boolean {
  if (failureCount >= MAX_RETRIES) return false;
  if (error instanceof ApiError) return error.status === 0 || error.status >= 500;
  if (error instanceof DOMException && error.name === "AbortError") return false;
  return error instanceof TypeError; // a fetch that never reached the server
}

export const isUnauthorized = (error: unknown) =>
  error instanceof ApiError && error.status === 401 && error.code !== "invalid_credentials";

type Handlers = {
  /** A request answered 401: the session is gone. */
  onUnauthorized: (client: QueryClient) => void;
  /** A mutation failed and no form handles it. */
  onMutationError: (error: Error) => void;
};

export function createQueryClient({ onUnauthorized, onMutationError }: Handlers): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (isUnauthorized(error)) onUnauthorized(client);
      },
    }),
    mutationCache: new MutationCache({
      onError: (error, _vars, _ctx, mutation) => {
        if (isUnauthorized(error)) {
          onUnauthorized(client);
          return;
        }
        if (mutation.meta?.handlesError) return;
        onMutationError(error);
      },
    }),
    defaultOptions: {
      queries: { retry: shouldRetry, staleTime: 30_000 },
      mutations: { retry: false },
    },
  });
  return client;
}
