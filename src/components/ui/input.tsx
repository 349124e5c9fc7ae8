import type { ComponentPropsWithRef } from "react";
import { cn } from "@/lib/cn";
import { useFieldControl } from "@/components/ui/field";

export const controlClass = cn(
  "h-8 w-full rounded-md border border-steel-300 bg-white px-2.5 text-sm text-steel-900 shadow-sm",
  "placeholder:text-steel-400 transition-colors",
  "hover:border-steel-400",
  "focus-visible:border-accent-600 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500/30 focus-visible:ring-offset-0",
  "disabled:cursor-not-allowed disabled:bg-steel-100 disabled:text-steel-500",
  "aria-[invalid=true]:border-danger-600 aria-[invalid=true]:focus-visible:ring-danger-600/25",
);

export type InputProps = ComponentPropsWithRef<"input">;

export function Input({ className, ...props }: InputProps) {
  const control = useFieldControl(props);
  return <input {...props} {...control} className={cn(controlClass, className)} />;
}
