import { useEffect, useSyncExternalStore } from "react";
import { cn } from "@/lib/cn";

export type ToastTone = "error" | "success" | "info";
export type ToastItem = { id: number; tone: ToastTone; message: string };

const DISMISS_AFTER_MS = { error: 8000, success: 4000, info: 5000 } as const;
const MAX_VISIBLE = 4;

let items: ToastItem[] = [];
let nextId = 1;
const listeners = new Set<() => void>();
const emit = () => listeners.forEach((l) => l());

function push(tone: ToastTone, message: string): number {
  const id = nextId++;
  items = [...items, { id, tone, message }].slice(-MAX_VISIBLE);
  emit();
  return id;
}

function dismiss(id: number) {
  items = items.filter((t) => t.id !== id);
  emit();
}

/** Shows a toast from anywhere, React or not (the query client's error handler uses it). */
export const toast = {
  error: (message: string) => push("error", message),
  success: (message: string) => push("success", message),
  info: (message: string) => push("info", message),
  dismiss,
};

const subscribe = (l: () => void) => {
  listeners.add(l);
  return () => listeners.delete(l);
};
const snapshot = () => items;

const toneClass: Record<ToastTone, string> = {
  error: "border-danger-200 border-l-danger-600",
  success: "border-ok-200 border-l-ok-600",
  info: "border-steel-200 border-l-steel-500",
};

function ToastCard({ item }: { item: ToastItem }) {
  useEffect(() => {
    const timer = setTimeout(() => dismiss(item.id), DISMISS_AFTER_MS[item.tone]);
    return () => clearTimeout(timer);
  }, [item.id, item.tone]);

  return (
    <li
      role={item.tone === "error" ? "alert" : "status"}
      className={cn(
        "pointer-events-auto flex w-80 max-w-[calc(100vw-2rem)] animate-slide-in items-start gap-3 rounded-md border border-l-4 bg-white px-3 py-2.5 text-sm text-steel-800 shadow-overlay",
        toneClass[item.tone],
      )}
    >
      <p className="min-w-0 flex-1">{item.message}</p>
      <button
        type="button"
        onClick={() => dismiss(item.id)}
        className="-mr-1 rounded p-0.5 text-steel-500 hover:text-steel-800 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
        aria-label="Dismiss notification"
      >
        <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
          <path d="m4 4 8 8M12 4l-8 8" strokeLinecap="round" />
        </svg>
      </button>
    </li>
  );
}

/** Renders the toasts; mount once near the root. */
export function Toaster() {
  const list = useSyncExternalStore(subscribe, snapshot, snapshot);
  return (
    <section aria-label="Notifications" className="pointer-events-none fixed bottom-4 right-4 z-50">
      <ol className="flex flex-col gap-2">
        {list.map((item) => (
          <ToastCard key={item.id} item={item} />
        ))}
      </ol>
    </section>
  );
}
