import { cx } from "./cx";

export const SAFETY_CAUTION =
  "Results support, and never replace, review by a qualified engineer. Local codes, the ride's manufacturer data and licensed practice govern.";

/** The caution that stands wherever results can appear. */
export function SafetyNote({ className, tone = "light" }: { className?: string; tone?: "light" | "dark" }) {
  return (
    <p
      data-testid="safety-caution"
      className={cx(
        "flex items-start gap-2 text-[12.5px] leading-relaxed",
        tone === "dark" ? "text-steel-300" : "text-steel-500",
        className,
      )}
    >
      <svg viewBox="0 0 16 16" className="mt-0.5 size-3.5 shrink-0" aria-hidden>
        <path d="M8 1.5 15 14H1z" fill="none" stroke="#c98a00" strokeWidth="1.6" strokeLinejoin="round" />
        <path d="M8 6v3.6M8 11.4v.1" stroke="#c98a00" strokeWidth="1.6" strokeLinecap="round" />
      </svg>
      <span>{SAFETY_CAUTION}</span>
    </p>
  );
}
