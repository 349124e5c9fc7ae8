import type { ComponentPropsWithRef } from "react";
import { cn } from "@/lib/cn";
import { useFieldControl } from "@/components/ui/field";
import { controlClass } from "@/components/ui/input";

export type TextareaProps = ComponentPropsWithRef<"textarea">;

/** A multi-line text box in the house style; inside a `<Field>` it gets the label, hint and error wiring. */
export function Textarea({ className, rows = 3, ...props }: TextareaProps) {
  const control = useFieldControl(props);
  return <textarea rows={rows} {...props} {...control} className={cn(controlClass, "h-auto py-1.5 leading-5", className)} />;
}
