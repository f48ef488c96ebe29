import Link from "next/link";
import type { ReactNode } from "react";
import { Logo } from "@/components/ui/Logo";
import { SafetyNote } from "@/components/ui/SafetyNote";

export const dynamic = "force-dynamic";

/** Sign-in, reset and invitation pages: one narrow column on the paper background. */
export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="px-6 py-5">
        <Link href="/" aria-label="Tautline home">
          <Logo />
        </Link>
      </header>
      <main className="flex flex-1 items-start justify-center px-4 pb-12 pt-6 sm:pt-14">
        <div className="w-full max-w-[400px]">{children}</div>
      </main>
      <footer className="border-t border-steel-300/60 px-6 py-4">
        <SafetyNote className="mx-auto max-w-3xl justify-center" />
      </footer>
    </div>
  );
}
