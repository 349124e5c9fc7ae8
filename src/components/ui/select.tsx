import type { ComponentPropsWithRef } from "react";
import { cn } from "@/lib/cn";
import { useFieldControl } from "@/components/ui/field";
import { controlClass } from "@/components/ui/input";

export type SelectProps = ComponentPropsWithRef<"select">;

/** A native select (keyboard and screen-reader behaviour for free) in the house style. */
export function Select({ className, children, ...props }: SelectProps) {
  const control = useFieldControl(props);
  return (
    <div className={cn("relative", className)}>
      <select {...props} {...control} className={cn(controlClass, "appearance-none pr-8")}>
        {children}
      </select>
      <svg
        viewBox="0 0 16 16"
        aria-hidden="true"
        className="pointer-events-none absolute right-2 top-1/2 size-4 -translate-y-1/2 text-steel-500"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.5"
      >
        <path d="m4.5 6.5 3.5 3.5 3.5-3.5" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
    </div>
  );
}
