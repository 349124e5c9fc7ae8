import { useEffect, useRef, useState } from "react";
import { cn } from "@/lib/cn";

type Props = {
  /** The saved value, as it is shown in the input ("12.50", "3", ""). */
  value: string;
  /** Accessible name: "Cost of SKU-12". */
  label: string;
  /** Checks and saves the typed text; resolves to an error message to show, or null when saved/accepted. */
  onCommit: (text: string) => Promise<string | null> | string | null;
  prefix?: string;
  suffix?: string;
  placeholder?: string;
  disabled?: boolean;
  className?: string;
};

/**
 * A number edited in place in a table cell: looks like text until hovered or focused; Enter or leaving the
 * cell saves, Escape puts the saved value back. A refused value stays in the cell with its message.
 */
export function InlineNumberCell({ value, label, onCommit, prefix, suffix, placeholder, disabled, className }: Props) {
  const [draft, setDraft] = useState(value);
  const [error, setError] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const dirty = useRef(false);
  const skipBlur = useRef(false);
  const latest = useRef(value);
  latest.current = value;

  // follow the server's value unless the person has typed something not yet saved
  useEffect(() => {
    if (!dirty.current) {
      setDraft(value);
      setError(null);
    }
  }, [value]);

  const commit = async () => {
    if (draft.trim() === value.trim()) {
      dirty.current = false;
      setError(null);
      return;
    }
    setSaving(true);
    try {
      const message = await onCommit(draft);
      setError(message);
      if (message === null) {
        dirty.current = false;
        setDraft(latest.current);
      }
    } finally {
      setSaving(false);
    }
  };

  return (
    <div className={cn("relative", className)}>
      <div
        className={cn(
          "flex h-7 items-center rounded border bg-transparent px-1.5 text-right tabular-nums transition-colors",
          "focus-within:border-accent-600 focus-within:bg-white focus-within:ring-2 focus-within:ring-accent-500/30",
          error ? "border-danger-600 bg-danger-50" : "border-transparent hover:border-steel-300 hover:bg-white",
          disabled && "pointer-events-none opacity-70",
        )}
      >
        {prefix && <span className="text-steel-500" aria-hidden="true">{prefix}</span>}
        <input
          type="text"
          inputMode="decimal"
          aria-label={label}
          aria-invalid={error ? true : undefined}
          title={error ?? undefined}
          value={draft}
          placeholder={placeholder}
          disabled={disabled}
          onChange={(e) => {
            dirty.current = true;
            setDraft(e.target.value);
          }}
          onKeyDown={(e) => {
            if (e.key === "Enter") {
              e.preventDefault();
              skipBlur.current = true;
              void commit();
            } else if (e.key === "Escape") {
              e.preventDefault();
              dirty.current = false;
              setDraft(value);
              setError(null);
            }
          }}
          onBlur={() => {
            if (skipBlur.current) {
              skipBlur.current = false;
              return;
            }
            void commit();
          }}
          className="w-full min-w-0 bg-transparent text-right text-sm text-steel-900 outline-none placeholder:text-steel-400"
        />
        {suffix && <span className="ml-0.5 text-steel-500" aria-hidden="true">{suffix}</span>}
        {saving && <span className="sr-only">Saving</span>}
      </div>
      {error && (
        <p role="alert" className="mt-0.5 max-w-[12rem] text-left text-xs leading-tight text-danger-700">
          {error}
        </p>
      )}
    </div>
  );
}
