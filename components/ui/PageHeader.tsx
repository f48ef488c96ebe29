import type { ReactNode } from "react";

export function PageHeader({
  title,
  eyebrow,
  description,
  actions,
}: {
  title: string;
  eyebrow?: string;
  description?: ReactNode;
  actions?: ReactNode;
}) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-steel-300/60 pb-4">
      <div className="max-w-3xl">
        {eyebrow && <p className="mb-1 font-mono text-[11.5px] font-semibold uppercase tracking-[0.14em] text-lamp-600">{eyebrow}</p>}
        <h1 data-testid="page-title" className="text-[22px] font-bold tracking-tight text-ink-950">
          {title}
        </h1>
        {description && <p className="mt-1.5 text-[14px] leading-relaxed text-steel-500">{description}</p>}
      </div>
      {actions && <div className="flex items-center gap-2">{actions}</div>}
    </header>
  );
}
