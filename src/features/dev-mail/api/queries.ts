import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export type CaughtAttachment = { filename: string; contentType: string; size: number };

/** One e-mail the local catcher received (`GET /api/dev/mail`). */
export type CaughtMail = {
  id: string;
  from?: string;
  to: string[] | string;
  cc?: string[];
  subject: string;
  text: string;
  html: string | null;
  date?: string;
  kind?: string | null;
  attachments: CaughtAttachment[];
};

export const devMailKeys = { all: ["dev-mail"] as const, list: () => [...devMailKeys.all, "list"] as const };

/** How often the inbox asks for new mail (the outbox delivers within seconds). */
export const DEV_MAIL_POLL_MS = 5000;

export const devMailQueries = {
  list: () =>
    queryOptions({
      queryKey: devMailKeys.list(),
      queryFn: ({ signal }) => api<{ data: CaughtMail[] }>("/dev/mail", { signal }).then((r) => r.data),
      staleTime: 0,
    }),
};

export const useDevMail = () =>
  useQuery({
    ...devMailQueries.list(),
    // keep polling while the catcher answers; a 404 (real SMTP server) stops it
    refetchInterval: (q) => (q.state.status === "error" ? false : DEV_MAIL_POLL_MS),
  });

export const attachmentUrl = (id: string, index: number) => `/api/dev/mail/${encodeURIComponent(id)}/attachments/${index}`;

export const recipients = (to: CaughtMail["to"]) => (Array.isArray(to) ? to.join(", ") : to);
