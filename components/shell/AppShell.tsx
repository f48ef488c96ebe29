import Link from "next/link";
import type { ReactNode } from "react";
import { can } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/auth/roles";
import type { CurrentUser } from "@/lib/auth/session";
import { Logo } from "@/components/ui/Logo";
import { SafetyNote } from "@/components/ui/SafetyNote";
import { NAV_ITEMS } from "./nav";
import { NavLinks } from "./NavLinks";
import { UserMenu } from "./UserMenu";

/** The signed-in frame: navigation on the left, user menu on top, the safety caution in the footer. */
export function AppShell({ user, organisationName, children }: { user: CurrentUser; organisationName: string; children: ReactNode }) {
  const items = NAV_ITEMS.filter((i) => !i.action || can(user.role, i.action)).map(({ href, label, group }) => ({ href, label, group }));
  return (
    <div className="flex min-h-screen">
      {/* The dark column spans the whole page; only its contents stay in view while scrolling. */}
      <aside className="hidden w-60 shrink-0 bg-ink-950 md:block print:hidden" data-testid="app-sidebar">
        <div className="sticky top-0 flex h-screen flex-col px-3 py-4">
        <Link href="/dashboard" className="mb-6 px-2" aria-label="Tautline overview">
          <Logo tone="light" />
        </Link>
        <NavLinks items={items} />
        <div className="mt-auto rounded-md border border-ink-800 px-3 py-2.5">
          <p className="font-mono text-[10.5px] uppercase tracking-[0.16em] text-steel-500">Organisation</p>
          <p className="mt-0.5 text-[13px] font-semibold text-steel-100" data-testid="organisation-name">
            {organisationName}
          </p>
        </div>
        </div>
      </aside>
      <div className="flex min-w-0 flex-1 flex-col">
        <header className="sticky top-0 z-10 flex h-14 print:hidden items-center justify-between gap-4 border-b border-steel-300/60 bg-paper/90 px-6 backdrop-blur">
          <Link href="/dashboard" className="md:hidden" aria-label="Tautline overview">
            <Logo size={24} />
          </Link>
          <details className="md:hidden">
            <summary className="cursor-pointer text-[13px] font-semibold">Menu</summary>
            <div className="absolute left-0 right-0 top-14 bg-ink-950 p-3">
              <NavLinks items={items} />
            </div>
          </details>
          <div className="hidden md:block" />
          <UserMenu
            name={user.name}
            email={user.email}
            roleLabel={ROLE_LABELS[user.role]}
            organisationName={organisationName}
            units={user.units}
          />
        </header>
        <main className="flex-1 px-6 py-6 lg:px-10 print:p-0">
          <div className="mx-auto max-w-6xl print:max-w-none">{children}</div>
        </main>
        <footer className="border-t border-steel-300/60 px-6 py-4 lg:px-10 print:px-0">
          <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3">
            <SafetyNote />
            <p className="font-mono text-[11px] text-steel-500">Tautline · SI inside, {user.units === "si" ? "SI" : "US customary"} on screen</p>
          </div>
        </footer>
      </div>
    </div>
  );
}
