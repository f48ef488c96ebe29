import type { ReactNode } from "react";

export function AuthCard({ title, lead, children, footer }: { title: string; lead?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div>
      <div className="rounded-lg border border-steel-300/70 bg-white px-6 py-6 shadow-sm shadow-ink-950/[0.04]">
        <h1 data-testid="page-title" className="text-[20px] font-bold tracking-tight text-ink-950">
          {title}
        </h1>
        {lead && <p className="mt-1 text-[13.5px] leading-relaxed text-steel-500">{lead}</p>}
        <div className="mt-5">{children}</div>
      </div>
      {footer && <div className="mt-4 text-center text-[13px] text-steel-500">{footer}</div>}
    </div>
  );
}
