import { useEffect, useRef, useState, type ComponentPropsWithRef } from "react";
import { Input } from "@/components/ui/input";

type Props = Omit<ComponentPropsWithRef<"input">, "value" | "onChange" | "defaultValue" | "onError"> & {
  /** The value as text, shown while the field is not being edited. */
  value: string;
  /** Reads the text; returns an error message for text it cannot use. */
  parse?: (text: string) => { ok: true } | { ok: false; error: string };
  /** Called on Enter or blur when the text changed and parses. */
  onCommit: (text: string) => void;
  /** Where a parse error is shown (id of an element the caller renders), optional. */
  onParseError?: (error: string | null) => void;
};

/**
 * A text field that commits on Enter or when it loses focus (one undo step per entry, not per key).
 * Escape puts the current value back. Follows the value from outside while not focused.
 */
export function CommitInput({ value, parse, onCommit, onParseError: onError, onBlur, onKeyDown, onFocus, ...props }: Props) {
  const [text, setText] = useState(value);
  const [invalid, setInvalid] = useState(false);
  const focused = useRef(false);
  const skipCommit = useRef(false);
  useEffect(() => {
    if (!focused.current) setText(value);
  }, [value]);

  const commit = () => {
    if (text === value) {
      setInvalid(false);
      onError?.(null);
      return;
    }
    const r = parse?.(text) ?? { ok: true as const };
    if (!r.ok) {
      setInvalid(true);
      onError?.(r.error);
      return;
    }
    setInvalid(false);
    onError?.(null);
    onCommit(text);
  };

  return (
    <Input
      {...props}
      value={text}
      aria-invalid={invalid || undefined}
      onChange={(e) => setText(e.target.value)}
      onFocus={(e) => {
        focused.current = true;
        onFocus?.(e);
      }}
      onBlur={(e) => {
        focused.current = false;
        if (skipCommit.current) skipCommit.current = false;
        else commit();
        onBlur?.(e);
      }}
      onKeyDown={(e) => {
        if (e.key === "Enter") {
          e.preventDefault();
          commit();
        } else if (e.key === "Escape") {
          setText(value);
          setInvalid(false);
          onError?.(null);
          skipCommit.current = true;
          (e.target as HTMLInputElement).blur();
        }
        onKeyDown?.(e);
      }}
    />
  );
}
