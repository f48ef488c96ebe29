"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { signOut } from "next-auth/react";
import { useEffect, useRef, useState } from "react";
import { submitJson } from "@/lib/client/fetch";
import { cx } from "@/components/ui/cx";
import { useHydrated } from "@/components/ui/ClientForm";

export function UserMenu({
  name,
  email,
  roleLabel,
  organisationName,
  units,
}: {
  name: string;
  email: string;
  roleLabel: string;
  organisationName: string;
  units: "si" | "us";
}) {
  const hydrated = useHydrated();
  const [open, setOpen] = useState(false);
  const [saving, setSaving] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const router = useRouter();
  const ref = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (!open) return;
    const close = (e: MouseEvent) => {
      if (ref.current && !ref.current.contains(e.target as Node)) setOpen(false);
    };
    const esc = (e: KeyboardEvent) => e.key === "Escape" && setOpen(false);
    document.addEventListener("mousedown", close);
    document.addEventListener("keydown", esc);
    return () => {
      document.removeEventListener("mousedown", close);
      document.removeEventListener("keydown", esc);
    };
  }, [open]);

  async function chooseUnits(next: "si" | "us") {
    if (next === units) return;
    setSaving(true);
    setError(null);
    const res = await submitJson("/api/me", "PATCH", { units: next });
    setSaving(false);
    if (!res.ok) setError(res.error);
    else router.refresh();
  }

  const initials = name
    .split(/\s+/)
    .map((p) => p[0])
    .slice(0, 2)
    .join("")
    .toUpperCase();

  return (
    <div className="relative" ref={ref}>
      <button
        type="button"
        data-testid="user-menu"
        aria-haspopup="menu"
        aria-expanded={open}
        disabled={!hydrated}
        onClick={() => setOpen((o) => !o)}
        className="flex items-center gap-2.5 rounded-md border border-transparent py-1 pl-1 pr-2.5 text-left hover:border-steel-300 hover:bg-white"
      >
        <span className="grid size-8 place-items-center rounded-md bg-ink-800 font-mono text-[12px] font-semibold text-lamp-300">
          {initials}
        </span>
        <span className="hidden leading-tight sm:block">
          <span className="block text-[13px] font-semibold text-ink-900" data-testid="user-name">
            {name}
          </span>
          <span className="block text-[11.5px] text-steel-500" data-testid="user-role">
            {roleLabel}
          </span>
        </span>
      </button>
      {open && (
        <div
          role="menu"
          className="absolute right-0 z-20 mt-1.5 w-72 rounded-lg border border-steel-300 bg-white p-1.5 shadow-lg shadow-ink-950/10"
        >
          <div className="border-b border-steel-100 px-3 pb-2.5 pt-1.5">
            <p className="truncate text-[13px] font-semibold">{email}</p>
            <p className="text-[12px] text-steel-500">{organisationName}</p>
          </div>
          <div className="px-3 py-2.5">
            <p className="mb-1.5 text-[11.5px] font-semibold uppercase tracking-wide text-steel-500">Display units</p>
            <div className="grid grid-cols-2 gap-1 rounded-md bg-steel-100 p-0.5" data-testid="units-toggle">
              {(["si", "us"] as const).map((u) => (
                <button
                  key={u}
                  type="button"
                  disabled={saving}
                  aria-pressed={units === u}
                  onClick={() => chooseUnits(u)}
                  className={cx(
                    "rounded px-2 py-1 text-[12.5px] font-semibold",
                    units === u ? "bg-white text-ink-950 shadow-sm" : "text-steel-500 hover:text-ink-900",
                  )}
                >
                  {u === "si" ? "SI (kN, m)" : "US (lbf, ft)"}
                </button>
              ))}
            </div>
            {error && <p className="mt-1.5 text-[12px] text-fail">{error}</p>}
          </div>
          <div className="border-t border-steel-100 pt-1">
            <Link
              role="menuitem"
              href="/settings"
              onClick={() => setOpen(false)}
              className="block rounded-md px-3 py-1.5 text-[13px] hover:bg-steel-100"
            >
              Settings
            </Link>
            <button
              role="menuitem"
              type="button"
              data-testid="sign-out"
              onClick={() => signOut({ callbackUrl: "/sign-in?signedOut=1" })}
              className="block w-full rounded-md px-3 py-1.5 text-left text-[13px] hover:bg-steel-100"
            >
              Sign out
            </button>
          </div>
        </div>
      )}
    </div>
  );
}
