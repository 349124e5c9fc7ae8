import type { ReactNode } from "react";
import { LogoMark } from "@/components/layout/logo-mark";

/** The signed-out pages' frame (the same look as the sign-in page). */
export function AuthCard({ title, intro, children, below }: { title: string; intro?: ReactNode; children: ReactNode; below?: ReactNode }) {
  return (
    <div
      className="flex min-h-screen flex-col items-center justify-center bg-steel-100 px-4 py-10"
      style={{
        backgroundImage:
          "repeating-linear-gradient(90deg, transparent 0 55px, rgb(188 194 201 / 0.35) 55px 56px, transparent 56px 58px, rgb(255 255 255 / 0.5) 58px 59px)",
      }}
    >
      <title>{`${title} · Ridgewright`}</title>
      <div className="w-full max-w-[22rem]">
        <div className="mb-5 flex items-center justify-center gap-2.5">
          <LogoMark className="size-9" />
          <span className="text-xl font-semibold tracking-tight text-steel-950">Ridgewright</span>
        </div>
        <div className="rounded-lg border border-steel-200 bg-white px-6 pb-6 pt-5 shadow-panel">
          <h1 className="text-base font-semibold text-steel-950">{title}</h1>
          {intro && <p className="mb-4 mt-0.5 text-sm text-steel-600">{intro}</p>}
          {children}
        </div>
        {below && <div className="mt-4 text-center text-xs leading-relaxed text-steel-600">{below}</div>}
      </div>
    </div>
  );
}
