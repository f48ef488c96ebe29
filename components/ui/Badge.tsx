import type { ReactNode } from "react";
import { cx } from "./cx";

export type Tone = "neutral" | "pass" | "caution" | "fail" | "lamp" | "ink";

const tones: Record<Tone, string> = {
  neutral: "bg-steel-100 text-ink-800 border-steel-300/60",
  pass: "bg-pass/10 text-pass border-pass/30",
  caution: "bg-caution/10 text-[#7a5400] border-caution/40",
  fail: "bg-fail/10 text-fail border-fail/30",
  lamp: "bg-lamp-300/30 text-lamp-600 border-lamp-500/40",
  ink: "bg-ink-800 text-steel-100 border-ink-700",
};

/** A short status word. Colour is never the only signal: the word itself says the state. */
export function Badge({ tone = "neutral", children, className }: { tone?: Tone; children: ReactNode; className?: string }) {
  return (
    <span
      className={cx(
        "inline-flex items-center rounded border px-1.5 py-px text-[11.5px] font-semibold uppercase tracking-wide",
        tones[tone],
        className,
      )}
    >
      {children}
    </span>
  );
}
