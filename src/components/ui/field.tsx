import { createContext, useContext, useId, type ReactNode } from "react";
import { cn } from "@/lib/cn";

type FieldControl = { id: string; describedBy?: string; invalid: boolean };

const FieldContext = createContext<FieldControl | null>(null);

/**
 * What a control inside a `<Field>` needs: its id (the label points at it), aria-invalid and
 * aria-describedby (hint and error). Explicit props on the control win.
 */
export function useFieldControl(props: {
  id?: string;
  "aria-invalid"?: boolean | "true" | "false" | "grammar" | "spelling";
  "aria-describedby"?: string;
}) {
  const field = useContext(FieldContext);
  return {
    id: props.id ?? field?.id,
    "aria-invalid": props["aria-invalid"] ?? (field?.invalid ? true : undefined),
    "aria-describedby": [field?.describedBy, props["aria-describedby"]].filter(Boolean).join(" ") || undefined,
  };
}

type FieldProps = {
  label: ReactNode;
  error?: string;
  hint?: ReactNode;
  /** Fixes the control's id (otherwise generated). */
  id?: string;
  className?: string;
  children: ReactNode;
};

/** A label, one control, an optional hint and an error message, wired for screen readers. */
export function Field({ label, error, hint, id, className, children }: FieldProps) {
  const generated = useId();
  const controlId = id ?? `field-${generated}`;
  const hintId = hint ? `${controlId}-hint` : undefined;
  const errorId = error ? `${controlId}-error` : undefined;
  const describedBy = [errorId, hintId].filter(Boolean).join(" ") || undefined;

  return (
    <FieldContext.Provider value={{ id: controlId, describedBy, invalid: Boolean(error) }}>
      <div className={cn("flex flex-col gap-1", className)}>
        <label htmlFor={controlId} className="text-xs font-medium text-steel-700">
          {label}
        </label>
        {children}
        {error && (
          <p id={errorId} className="flex items-start gap-1 text-xs text-danger-700">
            <svg viewBox="0 0 16 16" className="mt-px size-3.5 shrink-0" fill="currentColor" aria-hidden="true">
              <path d="M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13ZM7.25 4.5h1.5v4.25h-1.5V4.5Zm0 5.75h1.5v1.5h-1.5v-1.5Z" />
            </svg>
            <span>{error}</span>
          </p>
        )}
        {hint && (
          <p id={hintId} className="text-xs text-steel-500">
            {hint}
          </p>
        )}
      </div>
    </FieldContext.Provider>
  );
}
