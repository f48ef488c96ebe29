"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import type { FakeMessage } from "@/lib/mail/mailbox";
import { Button } from "@/components/ui/Button";
import { submitJson } from "@/lib/client/fetch";
import { cx } from "@/components/ui/cx";
import { formatDate } from "@/lib/client/dates";

/** Turns URLs in plain text into links, leaving everything else as text (no HTML from the message runs). */
function Linkified({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return (
    <>
      {parts.map((p, i) =>
        /^https?:\/\//.test(p) ? (
          <a key={i} href={p} className="break-all font-semibold text-ink-800 underline decoration-lamp-500 underline-offset-2" data-testid="mail-link">
            {p}
          </a>
        ) : (
          <span key={i}>{p}</span>
        ),
      )}
    </>
  );
}

export function MailList({ messages }: { messages: FakeMessage[] }) {
  const router = useRouter();
  const [openId, setOpenId] = useState<string | null>(messages[0]?.id ?? null);
  const [busy, setBusy] = useState(false);
  const open = messages.find((m) => m.id === openId) ?? null;

  async function clear() {
    setBusy(true);
    await submitJson("/api/admin/mail", "DELETE");
    setBusy(false);
    router.refresh();
  }

  if (!messages.length) {
    return <p className="px-5 py-8 text-center text-[14px] text-steel-500" data-testid="mail-empty">No messages yet. Invitations and reset links will show up here.</p>;
  }
  return (
    <div className="grid min-h-[420px] md:grid-cols-[320px_minmax(0,1fr)]">
      <div className="border-b border-steel-100 md:border-b-0 md:border-r">
        <div className="flex items-center justify-between px-4 py-2">
          <span className="text-[12px] text-steel-500">{messages.length} kept, newest first</span>
          <Button size="sm" variant="ghost" busy={busy} onClick={clear}>
            Delete these
          </Button>
        </div>
        <ul data-testid="mail-list">
          {messages.map((m) => (
            <li key={m.id}>
              <button
                type="button"
                onClick={() => setOpenId(m.id)}
                className={cx("block w-full border-l-2 px-4 py-2.5 text-left", m.id === openId ? "border-lamp-500 bg-paper" : "border-transparent hover:bg-paper/60")}
              >
                <span className="block truncate text-[13px] font-semibold">{m.subject || "(no subject)"}</span>
                <span className="block truncate font-mono text-[11.5px] text-steel-500">
                  {m.to.join(", ")} · {formatDate(m.date, "utcTime")}
                </span>
              </button>
            </li>
          ))}
        </ul>
      </div>
      {open && (
        <article className="min-w-0 px-6 py-4" data-testid="mail-message">
          <h3 className="text-[16px] font-bold">{open.subject}</h3>
          <dl className="mt-2 grid grid-cols-[60px_1fr] gap-y-0.5 font-mono text-[12px] text-steel-500">
            <dt>From</dt>
            <dd>{open.from}</dd>
            <dt>To</dt>
            <dd>{open.to.join(", ")}</dd>
            <dt>Date</dt>
            <dd>{formatDate(open.date, "utcDayTime")}</dd>
          </dl>
          <div className="mt-4 whitespace-pre-wrap rounded-md border border-steel-100 bg-paper/50 p-4 text-[14px] leading-relaxed">
            <Linkified text={open.text} />
          </div>
        </article>
      )}
    </div>
  );
}
