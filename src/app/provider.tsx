import { useState } from "react";
import { QueryClientProvider } from "@tanstack/react-query";
import { RouterProvider } from "react-router-dom";
import { errorMessage } from "@/lib/api-client";
import { createQueryClient } from "@/lib/query-client";
import { Toaster, toast } from "@/components/ui/toast";
import { authKeys } from "@/lib/auth";
import { createAppRouter } from "@/app/router";

/** One query client for the app: a 401 anywhere forgets the user; failed mutations no form handles become toasts. */
export function makeAppQueryClient() {
  return createQueryClient({
    onUnauthorized: (qc) => qc.setQueryData(authKeys.me, null),
    onMutationError: (error) => toast.error(errorMessage(error)),
  });
}

export function AppProvider() {
  const [queryClient] = useState(makeAppQueryClient);
  const [router] = useState(() => createAppRouter(queryClient));
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
      <Toaster />
    </QueryClientProvider>
  );
}
