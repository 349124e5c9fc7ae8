import { cn } from "@/lib/cn";

type Props = { className?: string; label?: string };

/** A small spinning ring. With `label` it is announced; without, it is decoration. */
export function Spinner({ className, label }: Props) {
  return (
    <svg
      viewBox="0 0 24 24"
      fill="none"
      className={cn("size-4 animate-spin", className)}
      role={label ? "status" : undefined}
      aria-label={label}
      aria-hidden={label ? undefined : true}
    >
      <circle cx="12" cy="12" r="9" stroke="currentColor" strokeOpacity="0.25" strokeWidth="3" />
      <path d="M21 12a9 9 0 0 0-9-9" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
}

export function FullPageSpinner({ label = "Loading" }: { label?: string }) {
  return (
    <div className="flex min-h-[50vh] items-center justify-center text-steel-500">
      <Spinner className="size-6" label={label} />
    </div>
  );
}

/** A section's data on its way: the spinner (announced as `label`) and `text` beside it. */
export function LoadingRow({ label, text = "Loading…" }: { label: string; text?: string }) {
  return (
    <div className="flex items-center gap-2 py-10 text-steel-500">
      <Spinner label={label} /> <span>{text}</span>
    </div>
  );
}
