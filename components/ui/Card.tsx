import type { HTMLAttributes, ReactNode } from "react";
import { cx } from "./cx";

export function Card({ className, children, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return (
    <div className={cx("rounded-lg border border-steel-300/70 bg-white shadow-sm shadow-ink-950/[0.03]", className)} {...rest}>
      {children}
    </div>
  );
}

export function CardHeader({ title, description, actions }: { title: ReactNode; description?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="flex items-start justify-between gap-4 border-b border-steel-100 px-5 py-3.5">
      <div>
        <h2 className="text-[15px] font-bold text-ink-900">{title}</h2>
        {description && <p className="mt-0.5 text-[13px] text-steel-500">{description}</p>}
      </div>
      {actions}
    </div>
  );
}

export function CardBody({ className, children }: { className?: string; children: ReactNode }) {
  return <div className={cx("px-5 py-4", className)}>{children}</div>;
}
