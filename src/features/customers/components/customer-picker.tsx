import { useEffect, useId, useRef, useState } from "react";
import type { CustomerDto } from "@shared/schemas/customer";
import { cn } from "@/lib/cn";
import { errorMessage } from "@/lib/api-client";
import { useFieldControl } from "@/components/ui/field";
import { controlClass } from "@/components/ui/input";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { useCustomers } from "@/lib/queries/customers";

type Picked = Pick<CustomerDto, "id" | "name"> & Partial<CustomerDto>;

type Props = {
  value: Picked | null;
  onChange: (customer: Picked | null) => void;
  /** "Add … as a new customer": switches the form to the inline customer fields, with the typed name. */
  onAddNew: (name: string) => void;
  onBlur?: () => void;
  id?: string;
  "aria-invalid"?: boolean;
  "aria-describedby"?: string;
};

function useDebounced<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return settled;
}

const addressOf = (c: Partial<CustomerDto>) => [c.addressLine1, c.city].filter(Boolean).join(", ");

/**
 * A searchable customer select (ARIA combobox with a listbox) over GET /api/customers?q=, live customers
 * only. Arrow keys move, Enter picks, Escape closes. The last option adds a new customer instead.
 */
export function CustomerPicker({ value, onChange, onAddNew, onBlur, ...rest }: Props) {
  const control = useFieldControl(rest);
  const listId = useId();
  const [text, setText] = useState("");
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  /** After a pick the input goes away: focus moves to the Change button, not to the page. */
  const [justPicked, setJustPicked] = useState(false);
  const inputRef = useRef<HTMLInputElement>(null);
  const q = useDebounced(text.trim(), 250);
  const results = useCustomers({ q: q || undefined, pageSize: 8 }, open && !value);
  const options = results.data?.data ?? [];
  const addIndex = options.length; // the "add new" row is last
  const optionId = (i: number) => `${listId}-opt-${i}`;

  useEffect(() => setActive(0), [q]);

  if (value) {
    const address = addressOf(value);
    return (
      <div className="flex items-center justify-between gap-3 rounded-md border border-steel-300 bg-steel-50 px-2.5 py-1.5">
        <div className="min-w-0">
          <p className="truncate text-sm font-medium text-steel-900">{value.name}</p>
          <p className="truncate text-xs text-steel-600">
            {[value.email, address].filter(Boolean).join(" · ") || "No e-mail or address on file"}
          </p>
        </div>
        <Button
          variant="secondary"
          size="sm"
          autoFocus={justPicked}
          onClick={() => {
            onChange(null);
            setText("");
            setOpen(true);
            requestAnimationFrame(() => inputRef.current?.focus());
          }}
          aria-label={`Change customer (now ${value.name})`}
        >
          Change
        </Button>
      </div>
    );
  }

  const choose = (i: number) => {
    if (i === addIndex) {
      setOpen(false);
      onAddNew(text.trim());
      return;
    }
    const c = options[i];
    if (!c) return;
    onChange(c);
    setJustPicked(true);
    setOpen(false);
  };

  return (
    <div className="relative">
      <input
        ref={inputRef}
        {...control}
        type="text"
        role="combobox"
        aria-expanded={open}
        aria-controls={listId}
        aria-autocomplete="list"
        aria-activedescendant={open ? optionId(active) : undefined}
        autoComplete="off"
        placeholder="Search by name, e-mail, phone or street"
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          setOpen(true);
        }}
        onFocus={() => setOpen(true)}
        onClick={() => setOpen(true)}
        onBlur={() => {
          // let a click on an option land first
          setTimeout(() => setOpen(false), 120);
          onBlur?.();
        }}
        onKeyDown={(e) => {
          if (e.key === "ArrowDown") {
            e.preventDefault();
            setOpen(true);
            setActive((a) => Math.min(a + 1, addIndex));
          } else if (e.key === "ArrowUp") {
            e.preventDefault();
            setActive((a) => Math.max(a - 1, 0));
          } else if (e.key === "Enter") {
            if (open) {
              e.preventDefault();
              choose(active);
            }
          } else if (e.key === "Escape" && open) {
            e.preventDefault();
            e.stopPropagation(); // close the list, not the dialog
            setOpen(false);
          }
        }}
        className={controlClass}
      />
      {open && (
        <ul
          id={listId}
          role="listbox"
          aria-label="Customers"
          className="absolute inset-x-0 top-full z-20 mt-1 max-h-72 overflow-y-auto rounded-md border border-steel-200 bg-white py-1 shadow-overlay"
        >
          {results.isPending && (
            <li className="flex items-center gap-2 px-3 py-2 text-sm text-steel-500" role="presentation">
              <Spinner /> Searching…
            </li>
          )}
          {results.isError && (
            <li className="px-3 py-2 text-sm text-danger-700" role="presentation">
              {errorMessage(results.error)}
            </li>
          )}
          {results.isSuccess && options.length === 0 && (
            <li className="px-3 py-2 text-sm text-steel-500" role="presentation">
              {q ? `No customer matches “${q}”.` : "No customers yet."}
            </li>
          )}
          {options.map((c, i) => (
            <li
              key={c.id}
              id={optionId(i)}
              role="option"
              aria-selected={active === i}
              onMouseDown={(e) => e.preventDefault()}
              onMouseEnter={() => setActive(i)}
              onClick={() => choose(i)}
              className={cn("cursor-pointer px-3 py-1.5", active === i && "bg-accent-50")}
            >
              <span className="block truncate text-sm font-medium text-steel-900">{c.name}</span>
              <span className="block truncate text-xs text-steel-600">
                {[c.email, addressOf(c)].filter(Boolean).join(" · ") || "No e-mail or address"}
              </span>
            </li>
          ))}
          <li
            id={optionId(addIndex)}
            role="option"
            aria-selected={active === addIndex}
            onMouseDown={(e) => e.preventDefault()}
            onMouseEnter={() => setActive(addIndex)}
            onClick={() => choose(addIndex)}
            className={cn(
              "flex cursor-pointer items-center gap-1.5 border-t border-steel-100 px-3 py-2 text-sm font-medium text-accent-700",
              active === addIndex && "bg-accent-50",
            )}
          >
            <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.8" aria-hidden="true">
              <path d="M8 3v10M3 8h10" strokeLinecap="round" />
            </svg>
            {text.trim() ? `Add “${text.trim()}” as a new customer` : "Add a new customer"}
          </li>
        </ul>
      )}
    </div>
  );
}
