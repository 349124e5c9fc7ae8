import { cn } from "@/lib/cn";

/** Ridgewright's mark: a gable ridge line over standing seams. Same drawing as public/favicon.svg. */
export function LogoMark({ className, title }: { className?: string; title?: string }) {
  return (
    <svg
      viewBox="0 0 32 32"
      className={cn("size-7", className)}
      role={title ? "img" : undefined}
      aria-label={title}
      aria-hidden={title ? undefined : true}
    >
      <rect width="32" height="32" rx="7" className="fill-accent-700" />
      <path
        d="M4.5 17.5 16 7l11.5 10.5"
        fill="none"
        stroke="#fff"
        strokeWidth="2.6"
        strokeLinecap="round"
        strokeLinejoin="round"
      />
      <path d="M10 14v11.5M14 10.5v15M18 10.5v15M22 14v11.5" fill="none" stroke="#fff" strokeWidth="2" strokeLinecap="round" />
    </svg>
  );
}
