"use client";
/** Asks before a destructive action: the question in words, the action's own name on the button, and Cancel. */
import { Button } from "./Button";

export interface PendingAction {
  question: string;
  confirmLabel: string;
  run: () => void;
}

export function ConfirmBar({ pending, onCancel, busy }: { pending: PendingAction | null; onCancel: () => void; busy?: boolean }) {
  if (!pending) return null;
  return (
    <div role="alertdialog" aria-label={pending.question} data-testid="confirm-bar" className="mx-5 my-3 flex flex-wrap items-center gap-3 rounded-md border border-fail/40 bg-fail/5 px-4 py-3 text-[13.5px] text-ink-900">
      <p className="flex-1 font-medium">{pending.question}</p>
      <Button size="sm" variant="danger" busy={busy} data-testid="confirm-action" onClick={pending.run}>
        {pending.confirmLabel}
      </Button>
      <Button size="sm" variant="secondary" data-testid="confirm-cancel" onClick={onCancel} autoFocus>
        Cancel
      </Button>
    </div>
  );
}
