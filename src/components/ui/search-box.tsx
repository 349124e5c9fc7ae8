import { useEffect, useRef, useState } from "react";
import { cn } from "@/lib/cn";
import { controlClass } from "@/components/ui/input";

type Props = {
  /** The search as it is in the URL. */
  value: string;
  /** Called once typing has paused (debounced), and at once on Enter or clear. */
  onSearch: (q: string) => void;
  label: string;
  placeholder?: string;
  delayMs?: number;
  className?: string;
};

/**
 * A search field that reports after a pause in typing. It follows `value` when the URL changes
 * underneath it (back button) without fighting the person typing.
 */
export function SearchBox({ value, onSearch, label, placeholder, delayMs = 300, className }: Props) {
  const [text, setText] = useState(value);
  const lastSent = useRef(value);
  const onSearchRef = useRef(onSearch);
  onSearchRef.current = onSearch;
  // The pending pause-in-typing report; Enter or clear sends at once and cancels it, so it can't fire
  // later and navigate again (e.g. after the person has already clicked away to another page).
  const pending = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);

  useEffect(() => {
    if (value !== lastSent.current) {
      lastSent.current = value;
      setText(value);
    }
  }, [value]);

  useEffect(() => {
    if (text.trim() === lastSent.current.trim()) return;
    pending.current = setTimeout(() => {
      pending.current = undefined;
      lastSent.current = text.trim();
      onSearchRef.current(text.trim());
    }, delayMs);
    return () => clearTimeout(pending.current);
  }, [text, delayMs]);

  const sendNow = (q: string) => {
    clearTimeout(pending.current);
    pending.current = undefined;
    lastSent.current = q.trim();
    onSearchRef.current(q.trim());
  };

  return (
    <div className={cn("relative", className)}>
      <svg
        viewBox="0 0 16 16"
        aria-hidden="true"
        className="pointer-events-none absolute left-2 top-1/2 size-4 -translate-y-1/2 text-steel-400"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.5"
      >
        <circle cx="7" cy="7" r="4.25" />
        <path d="m10.25 10.25 3.25 3.25" strokeLinecap="round" />
      </svg>
      <input
        type="search"
        aria-label={label}
        placeholder={placeholder}
        value={text}
        maxLength={120}
        onChange={(e) => setText(e.target.value)}
        onKeyDown={(e) => {
          if (e.key === "Enter") {
            e.preventDefault();
            sendNow(text);
          }
        }}
        className={cn(controlClass, "pl-7 pr-7 [&::-webkit-search-cancel-button]:hidden")}
      />
      {text && (
        <button
          type="button"
          aria-label="Clear search"
          onClick={() => {
            setText("");
            sendNow("");
          }}
          className="absolute right-1.5 top-1/2 -translate-y-1/2 rounded p-0.5 text-steel-400 hover:text-steel-700 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
        >
          <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
            <path d="m4 4 8 8M12 4l-8 8" strokeLinecap="round" />
          </svg>
        </button>
      )}
    </div>
  );
}
