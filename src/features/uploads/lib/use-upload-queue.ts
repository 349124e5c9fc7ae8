import { useCallback, useEffect, useRef, useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { UPLOAD_MAX_BYTES, formatBytes, type AttachmentDto } from "@shared/schemas/attachment";
import { errorMessage } from "@/lib/api-client";
import { attachmentKeys, uploadAttachment } from "@/lib/queries/attachments";

export type UploadItem = {
  key: string;
  name: string;
  size: number;
  /** 0–1 while sending. */
  progress: number;
  state: "waiting" | "sending" | "done" | "failed";
  error?: string;
};

/** At most this many files go up at once (each file is its own request with its own progress). */
const PARALLEL = 3;
let seq = 0;

/**
 * Uploads files one request each, a few at a time, keeping each file's progress and outcome. Files over
 * the size limit are refused here with the server's wording, before anything is sent.
 */
export function useUploadQueue(jobId: number, opts: { kind?: "plan" } = {}) {
  const qc = useQueryClient();
  // The queue lives in a ref (side effects never run inside a state updater); state mirrors it for rendering.
  const list = useRef<UploadItem[]>([]);
  const [items, setItems] = useState<UploadItem[]>([]);
  const files = useRef(new Map<string, File>());
  const aborts = useRef(new Map<string, AbortController>());
  const running = useRef(0);

  const sync = useCallback(() => setItems([...list.current]), []);
  const patch = useCallback(
    (key: string, p: Partial<UploadItem>) => {
      list.current = list.current.map((i) => (i.key === key ? { ...i, ...p } : i));
      sync();
    },
    [sync],
  );

  const pump = useCallback(() => {
    while (running.current < PARALLEL) {
      const next = list.current.find((i) => i.state === "waiting" && files.current.has(i.key));
      if (!next) return;
      const file = files.current.get(next.key)!;
      files.current.delete(next.key);
      running.current++;
      const ctrl = new AbortController();
      aborts.current.set(next.key, ctrl);
      patch(next.key, { state: "sending" });
      uploadAttachment(jobId, file, {
        kind: opts.kind,
        signal: ctrl.signal,
        onProgress: (progress) => patch(next.key, { progress }),
      })
        .then((added: AttachmentDto[]) => {
          patch(next.key, { state: "done", progress: 1 });
          qc.setQueryData<AttachmentDto[]>(attachmentKeys.list(jobId), (old) => (old ? [...added, ...old.filter((o) => !added.some((a) => a.id === o.id))] : old));
          void qc.invalidateQueries({ queryKey: attachmentKeys.list(jobId) });
        })
        .catch((err: unknown) => {
          const cancelled = err instanceof DOMException && err.name === "AbortError";
          patch(next.key, { state: "failed", error: cancelled ? "Cancelled" : errorMessage(err) });
        })
        .finally(() => {
          running.current--;
          aborts.current.delete(next.key);
          pump();
        });
    }
  }, [jobId, opts.kind, patch, qc]);

  const add = useCallback(
    (picked: Iterable<File>) => {
      for (const file of picked) {
        const key = `u${++seq}`;
        if (file.size > UPLOAD_MAX_BYTES) {
          list.current.push({ key, name: file.name, size: file.size, progress: 0, state: "failed", error: `Each file may be at most ${formatBytes(UPLOAD_MAX_BYTES)}; this one is ${formatBytes(file.size)}` });
        } else if (file.size === 0) {
          list.current.push({ key, name: file.name, size: 0, progress: 0, state: "failed", error: "This file is empty" });
        } else {
          files.current.set(key, file);
          list.current.push({ key, name: file.name, size: file.size, progress: 0, state: "waiting" });
        }
      }
      sync();
      pump();
    },
    [pump, sync],
  );

  const cancel = useCallback(
    (key: string) => {
      aborts.current.get(key)?.abort();
      if (files.current.delete(key)) {
        list.current = list.current.filter((i) => i.key !== key);
        sync();
      }
    },
    [sync],
  );

  const dismiss = useCallback(
    (key: string) => {
      list.current = list.current.filter((i) => i.key !== key);
      sync();
    },
    [sync],
  );
  const clearFinished = useCallback(() => {
    list.current = list.current.filter((i) => i.state === "waiting" || i.state === "sending");
    sync();
  }, [sync]);

  useEffect(() => {
    const current = aborts.current;
    return () => {
      for (const c of current.values()) c.abort();
    };
  }, []);

  return { items, add, cancel, dismiss, clearFinished };
}
