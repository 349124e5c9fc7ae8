import { Link } from "react-router-dom";
import { EmptyState } from "@/components/ui/empty-state";
import { paths } from "@/config/paths";

/** Shown in place of a screen the signed-in role may not use. */
export function NoAccess({ screenName, roleLabel }: { screenName: string; roleLabel: string }) {
  return (
    <EmptyState
      className="mt-6"
      icon={
        <svg viewBox="0 0 24 24" className="size-8" fill="none" stroke="currentColor" strokeWidth="1.5">
          <rect x="5" y="10.5" width="14" height="10" rx="2" />
          <path d="M8 10.5V8a4 4 0 0 1 8 0v2.5" strokeLinecap="round" />
        </svg>
      }
      title="You don't have access"
      description={
        <>
          {screenName} isn't open to the {roleLabel.toLowerCase()} role. If you need it, ask your company's owner.
        </>
      }
      action={
        <Link
          to={paths.jobs}
          className="text-sm font-medium text-accent-700 underline-offset-2 hover:underline focus-visible:rounded focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
        >
          Go to Jobs
        </Link>
      }
    />
  );
}
