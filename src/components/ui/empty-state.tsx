import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

type Props = {
  title: ReactNode;
  description?: ReactNode;
  icon?: ReactNode;
  action?: ReactNode;
  className?: string;
};

export function EmptyState({ title, description, icon, action, className }: Props) {
  return (
    <div
      className={cn(
        "flex flex-col items-center justify-center rounded-lg border border-dashed border-steel-300 bg-white px-6 py-12 text-center",
        className,
      )}
    >
      {icon && <div className="mb-3 text-steel-400" aria-hidden="true">{icon}</div>}
      <h2 className="text-base font-semibold text-steel-900">{title}</h2>
      {description && <div className="mt-1 max-w-md text-sm text-steel-600">{description}</div>}
      {action && <div className="mt-4">{action}</div>}
    </div>
  );
}
