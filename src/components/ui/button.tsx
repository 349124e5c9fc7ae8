import type { ComponentPropsWithRef } from "react";
import { cn } from "@/lib/cn";
import { Spinner } from "@/components/ui/spinner";

const variants = {
  primary:
    "bg-accent-700 text-white shadow-sm hover:bg-accent-800 active:bg-accent-900 disabled:bg-accent-700/60",
  secondary:
    "border border-steel-300 bg-white text-steel-800 shadow-sm hover:bg-steel-50 active:bg-steel-100 disabled:text-steel-400",
  ghost: "text-steel-700 hover:bg-steel-100 active:bg-steel-200 disabled:text-steel-400",
  danger: "bg-danger-600 text-white shadow-sm hover:bg-danger-700 disabled:bg-danger-600/60",
} as const;

const sizes = {
  sm: "h-7 gap-1.5 px-2.5 text-xs",
  md: "h-8 gap-2 px-3 text-sm",
  lg: "h-10 gap-2 px-4 text-base",
} as const;

export type ButtonProps = ComponentPropsWithRef<"button"> & {
  variant?: keyof typeof variants;
  size?: keyof typeof sizes;
  /** Shows a spinner and disables the button. */
  loading?: boolean;
};

export function Button({
  variant = "primary",
  size = "md",
  loading = false,
  disabled,
  className,
  children,
  type = "button",
  ...props
}: ButtonProps) {
  return (
    <button
      type={type}
      disabled={disabled || loading}
      aria-busy={loading || undefined}
      className={cn(
        "inline-flex shrink-0 items-center justify-center whitespace-nowrap rounded-md font-medium transition-colors",
        "focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500 focus-visible:ring-offset-1",
        "disabled:cursor-not-allowed",
        variants[variant],
        sizes[size],
        className,
      )}
      {...props}
    >
      {loading && <Spinner />}
      {children}
    </button>
  );
}
