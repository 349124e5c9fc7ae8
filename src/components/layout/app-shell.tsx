import type { ReactNode } from "react";
import { Link, NavLink } from "react-router-dom";
import type { Role } from "@shared/auth/roles";
import { cn } from "@/lib/cn";
import { canOpen, mainNav, paths } from "@/config/paths";
import { ROLE_LABELS } from "@/config/roles";
import { LogoMark } from "@/components/layout/logo-mark";
import { Spinner } from "@/components/ui/spinner";

type Props = {
  user: { name: string; role: Role };
  onSignOut: () => void;
  signingOut?: boolean;
  /** A page is loading: shows a thin progress bar under the top bar. */
  busy?: boolean;
  children: ReactNode;
};

const darkFocus =
  "focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-400 focus-visible:ring-offset-2 focus-visible:ring-offset-steel-900";

function initials(name: string): string {
  const parts = name.trim().split(/\s+/).filter(Boolean);
  return ((parts[0]?.[0] ?? "") + (parts.length > 1 ? (parts[parts.length - 1]?.[0] ?? "") : "")).toUpperCase() || "?";
}

/** The signed-in frame: top bar with the product mark, role-aware navigation and the user's menu. */
export function AppShell({ user, onSignOut, signingOut = false, busy = false, children }: Props) {
  const nav = mainNav.filter((item) => canOpen(item.screen, user.role));

  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only z-50 rounded bg-white px-3 py-2 text-sm font-medium text-steel-900 focus:not-sr-only focus:fixed focus:left-3 focus:top-3 focus:ring-2 focus:ring-accent-500"
      >
        Skip to content
      </a>
      <header className="relative bg-steel-900 text-steel-200 shadow-sm">
        <div className="mx-auto flex max-w-screen-2xl flex-wrap items-center gap-x-6 px-4 lg:px-6">
          <Link to={paths.jobs} className={cn("flex h-12 items-center gap-2 rounded-sm text-white", darkFocus)}>
            <LogoMark />
            <span className="text-[15px] font-semibold tracking-tight">Ridgewright</span>
          </Link>

          <nav
            aria-label="Main"
            className="order-last -mx-4 w-[calc(100%+2rem)] overflow-x-auto border-t border-steel-800 px-4 lg:order-none lg:mx-0 lg:w-auto lg:border-0 lg:px-0"
          >
            <ul className="flex h-10 items-stretch gap-1 lg:h-12">
              {nav.map((item) => (
                <li key={item.to} className="flex">
                  <NavLink
                    to={item.to}
                    className={({ isActive }) =>
                      cn(
                        "relative flex items-center whitespace-nowrap rounded-sm px-3 text-sm font-medium transition-colors",
                        darkFocus,
                        isActive
                          ? "text-white after:absolute after:inset-x-2 after:bottom-0 after:h-0.5 after:rounded-full after:bg-accent-400"
                          : "text-steel-300 hover:bg-steel-800 hover:text-white",
                      )
                    }
                  >
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>

          <div className="ml-auto flex h-12 items-center gap-2">
            <div className="flex items-center gap-2 pr-1">
              <span
                aria-hidden="true"
                className="flex size-7 items-center justify-center rounded-full bg-steel-700 text-xs font-semibold text-white"
              >
                {initials(user.name)}
              </span>
              <div className="hidden leading-tight sm:block">
                <p className="max-w-[12rem] truncate text-sm font-medium text-white">{user.name}</p>
                <p className="text-xs text-steel-400">{ROLE_LABELS[user.role]}</p>
              </div>
              <span className="sr-only sm:hidden">
                {user.name}, {ROLE_LABELS[user.role]}
              </span>
            </div>
            {canOpen("devMail", user.role) && (
              <NavLink
                to={paths.devMail}
                title="E-mail the app sent, caught locally"
                className={({ isActive }) =>
                  cn(
                    "hidden h-8 items-center rounded-md px-2.5 text-xs font-medium transition-colors sm:flex",
                    darkFocus,
                    isActive ? "bg-steel-800 text-white" : "text-steel-400 hover:bg-steel-800 hover:text-white",
                  )
                }
              >
                Test inbox
              </NavLink>
            )}
            <NavLink
              to={paths.account}
              className={({ isActive }) =>
                cn(
                  "flex h-8 items-center rounded-md px-2.5 text-sm font-medium transition-colors",
                  darkFocus,
                  isActive ? "bg-steel-800 text-white" : "text-steel-300 hover:bg-steel-800 hover:text-white",
                )
              }
            >
              Account
            </NavLink>
            <button
              type="button"
              onClick={onSignOut}
              disabled={signingOut}
              className={cn(
                "flex h-8 items-center gap-1.5 rounded-md border border-steel-700 px-2.5 text-sm font-medium text-steel-200 transition-colors hover:border-steel-500 hover:bg-steel-800 hover:text-white disabled:opacity-60",
                darkFocus,
              )}
            >
              {signingOut && <Spinner className="size-3.5" />}
              Sign out
            </button>
          </div>
        </div>
        {busy && (
          <div className="absolute inset-x-0 bottom-0 h-0.5 overflow-hidden" role="progressbar" aria-label="Loading page">
            <div className="h-full w-2/5 animate-progress bg-accent-400" />
          </div>
        )}
      </header>

      <main id="main" tabIndex={-1} className="mx-auto w-full max-w-screen-2xl flex-1 px-4 py-5 focus:outline-none focus-visible:ring-0 lg:px-6">
        {children}
      </main>
    </div>
  );
}
