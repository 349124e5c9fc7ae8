import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

const tones = {
  error: "border-danger-200 bg-danger-50 text-danger-700",
  info: "border-steel-200 bg-steel-50 text-steel-700",
  success: "border-ok-200 bg-ok-50 text-ok-700",
  caution: "border-caution-200 bg-caution-50 text-caution-700",
} as const;

type Props = {
  tone?: keyof typeof tones;
  title?: ReactNode;
  children?: ReactNode;
  className?: string;
  onDismiss?: () => void;
};

/** A message box. Errors are announced (role="alert"); other tones politely (role="status"). */
export function Alert({ tone = "info", title, children, className, onDismiss }: Props) {
  return (
    <div
      role={tone === "error" ? "alert" : "status"}
      className={cn("flex items-start gap-2 rounded-md border px-3 py-2 text-sm", tones[tone], className)}
    >
      <div className="min-w-0 flex-1">
        {title && <p className="font-semibold">{title}</p>}
        {children && <div className={title ? "mt-0.5" : undefined}>{children}</div>}
      </div>
      {onDismiss && (
        <button
          type="button"
          onClick={onDismiss}
          className="-mr-1 rounded p-0.5 opacity-70 hover:opacity-100 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
          aria-label="Dismiss"
        >
          <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
            <path d="m4 4 8 8M12 4l-8 8" strokeLinecap="round" />
          </svg>
        </button>
      )}
    </div>
  );
}
