import type { ComponentPropsWithRef } from "react";
import { cn } from "@/lib/cn";

/** A table in a bordered, horizontally scrollable panel (positioned, so sr-only text inside it stays clipped). */
export function Table({ className, ...props }: ComponentPropsWithRef<"table">) {
  return (
    <div className="relative overflow-x-auto rounded-lg border border-steel-200 bg-white shadow-panel">
      <table className={cn("w-full border-collapse text-left text-sm", className)} {...props} />
    </div>
  );
}

export function THead({ className, ...props }: ComponentPropsWithRef<"thead">) {
  return <thead className={cn("border-b border-steel-200 bg-steel-50", className)} {...props} />;
}

export function TBody({ className, ...props }: ComponentPropsWithRef<"tbody">) {
  return <tbody className={cn("divide-y divide-steel-100", className)} {...props} />;
}

export function Tr({ className, ...props }: ComponentPropsWithRef<"tr">) {
  return <tr className={cn("hover:bg-steel-50/60", className)} {...props} />;
}

export function Th({ className, scope = "col", ...props }: ComponentPropsWithRef<"th">) {
  return (
    <th
      scope={scope}
      className={cn("whitespace-nowrap px-3 py-2 text-xs font-semibold uppercase tracking-wide text-steel-600", className)}
      {...props}
    />
  );
}

export function Td({ className, ...props }: ComponentPropsWithRef<"td">) {
  return <td className={cn("px-3 py-2 align-middle text-steel-800", className)} {...props} />;
}
