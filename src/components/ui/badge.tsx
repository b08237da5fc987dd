import type { ReactNode } from "react";

const TONES = {
  neutral: "bg-paper-deep text-graphite-soft",
  copper: "bg-copper-light text-copper-dark",
  success: "bg-sage-light text-graphite",
  caution: "bg-caution-light text-caution",
  danger: "bg-danger-light text-danger",
  usage: "bg-slate-light text-usage",
} as const;

export type BadgeTone = keyof typeof TONES;

/** A short status word in a pill. */
export function Badge({ tone = "neutral", size = "sm", children, testId, className }: { tone?: BadgeTone; size?: "sm" | "md"; children: ReactNode; testId?: string; className?: string }) {
  const sizing = size === "md" ? "px-3 py-1 text-sm" : "px-2 py-0.5 text-xs";
  return (
    <span className={`inline-block rounded-full font-medium ${sizing} ${TONES[tone]} ${className ?? ""}`} data-testid={testId}>
      {children}
    </span>
  );
}
