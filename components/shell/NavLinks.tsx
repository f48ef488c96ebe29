"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { cx } from "@/components/ui/cx";

export interface NavLinkItem {
  href: string;
  label: string;
  group: string;
}

const GROUP_LABELS: Record<string, string> = { design: "Design", operate: "Operate & train", admin: "Organisation" };

export function NavLinks({ items }: { items: NavLinkItem[] }) {
  const pathname = usePathname();
  const groups = [...new Set(items.map((i) => i.group))];
  return (
    <nav aria-label="Main" data-testid="main-nav" className="space-y-5">
      {groups.map((g) => (
        <div key={g}>
          <p className="mb-1.5 px-3 font-mono text-[10.5px] font-semibold uppercase tracking-[0.16em] text-steel-500">
            {GROUP_LABELS[g] ?? g}
          </p>
          <ul className="space-y-0.5">
            {items
              .filter((i) => i.group === g)
              .map((i) => {
                const active = pathname === i.href || pathname.startsWith(`${i.href.replace(/\/users$/, "")}/`);
                return (
                  <li key={i.href}>
                    <Link
                      href={i.href}
                      aria-current={active ? "page" : undefined}
                      className={cx(
                        "flex items-center rounded-md border-l-2 px-3 py-1.5 text-[13.5px] font-medium transition-colors",
                        active
                          ? "border-lamp-500 bg-ink-800 text-paper"
                          : "border-transparent text-steel-300 hover:bg-ink-900 hover:text-paper",
                      )}
                    >
                      {i.label}
                    </Link>
                  </li>
                );
              })}
          </ul>
        </div>
      ))}
    </nav>
  );
}
