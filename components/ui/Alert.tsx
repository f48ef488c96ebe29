import type { ReactNode } from "react";
import { cx } from "./cx";

type Tone = "info" | "success" | "caution" | "error";

const tones: Record<Tone, string> = {
  info: "border-steel-300 bg-steel-100/60 text-ink-800",
  success: "border-pass/30 bg-pass/5 text-ink-900",
  caution: "border-caution/40 bg-caution/10 text-ink-900",
  error: "border-fail/35 bg-fail/5 text-ink-900",
};

const marks: Record<Tone, string> = { info: "bg-steel-500", success: "bg-pass", caution: "bg-caution", error: "bg-fail" };

/**
 * A message box. It uses role="status" (errors: role="alert" is avoided on purpose — tests look up
 * messages by their test id, and Next's route announcer already owns the alert role).
 */
export function Alert({
  tone = "info",
  title,
  children,
  className,
  testId,
}: {
  tone?: Tone;
  title?: ReactNode;
  children?: ReactNode;
  className?: string;
  testId?: string;
}) {
  return (
    <div role="status" data-testid={testId} className={cx("flex gap-3 rounded-md border px-3.5 py-3 text-[13.5px]", tones[tone], className)}>
      <span aria-hidden className={cx("mt-1 block h-3 w-1 shrink-0 rounded-full", marks[tone])} />
      <div className="space-y-0.5">
        {title && <p className="font-semibold">{title}</p>}
        {children && <div className="leading-relaxed">{children}</div>}
      </div>
    </div>
  );
}

/** A form's error in words (nothing when there is none). */
export function FormError({ error }: { error: string | null }) {
  return error ? (
    <Alert tone="error" testId="form-error">
      {error}
    </Alert>
  ) : null;
}
