/** The Tautline mark (same drawing as public/tautline-mark.svg) with the word beside it. */
export function Logo({ size = 28, wordmark = true, tone = "dark" }: { size?: number; wordmark?: boolean; tone?: "dark" | "light" }) {
  return (
    <span className="inline-flex items-center gap-2.5">
      <svg width={size} height={size} viewBox="0 0 64 64" aria-hidden>
        <rect width="64" height="64" rx="14" fill="#10202e" />
        <path d="M8 50 H20 Q24 50 27 46 L44 20 Q47 16 51 16 H57" fill="none" stroke="#5f7386" strokeWidth="4" strokeLinecap="round" />
        <path d="M14 44 L48 12" stroke="#e08a00" strokeWidth="4" strokeLinecap="round" />
        <circle cx="14" cy="44" r="4.5" fill="#f5c16c" />
        <circle cx="48" cy="12" r="4.5" fill="#f5c16c" />
        <rect x="10" y="52" width="8" height="6" rx="1.5" fill="#e08a00" />
      </svg>
      {wordmark && (
        <span className={`text-[17px] font-extrabold tracking-[-0.01em] ${tone === "light" ? "text-paper" : "text-ink-950"}`}>
          Tautline
        </span>
      )}
    </span>
  );
}
