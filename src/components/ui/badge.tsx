import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

const tones = {
  neutral: "bg-steel-100 text-steel-700 ring-steel-200",
  accent: "bg-accent-50 text-accent-800 ring-accent-200",
  ok: "bg-ok-50 text-ok-700 ring-ok-200",
  muted: "bg-white text-steel-500 ring-steel-200",
} as const;

export function Badge({ tone = "neutral", children, className }: { tone?: keyof typeof tones; children: ReactNode; className?: string }) {
  return (
    <span className={cn("inline-flex items-center rounded px-1.5 py-0.5 text-xs font-medium ring-1 ring-inset", tones[tone], className)}>
      {children}
    </span>
  );
}
