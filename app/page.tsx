import Link from "next/link";
import { ButtonLink } from "@/components/ui/Button";
import { Logo } from "@/components/ui/Logo";
import { SafetyNote } from "@/components/ui/SafetyNote";
import { getCurrentUserIfAvailable } from "@/lib/auth/session";

export const dynamic = "force-dynamic";

const AUDIENCES = [
  {
    who: "Ride engineers",
    what: "Size a chain lift and check it: snatch loads at pick-up, chain safety factors, take-up travel and motor power, for every train load you expect.",
  },
  {
    who: "Operations & maintenance",
    what: "See why a train settles back onto the anti-rollback device, how chain elongation moves the take-up, and where the counterweight should sit.",
  },
  {
    who: "Trainers",
    what: "Replay annotated scenarios on the lift hill — a pick-up, a stop on the lift, a rollback onto the ARD — and walk new staff through them.",
  },
];

function LiftSketch() {
  // A lift hill with the chain pulled taut, a train on it and the 2:1 take-up with its counterweight.
  return (
    <svg viewBox="0 0 520 300" className="h-auto w-full" aria-hidden>
      <defs>
        <pattern id="grid" width="20" height="20" patternUnits="userSpaceOnUse">
          <path d="M20 0H0V20" fill="none" stroke="#1a2f42" strokeWidth="1" />
        </pattern>
      </defs>
      <rect width="520" height="300" fill="url(#grid)" />
      <path d="M20 250 H120 Q150 250 170 228 L360 62 Q380 44 406 44 H500" fill="none" stroke="#5f7386" strokeWidth="6" strokeLinecap="round" />
      <path d="M134 244 L376 40" stroke="#e08a00" strokeWidth="3" strokeDasharray="7 5" />
      <circle cx="134" cy="244" r="12" fill="none" stroke="#f5c16c" strokeWidth="3" />
      <circle cx="376" cy="40" r="12" fill="none" stroke="#f5c16c" strokeWidth="3" />
      {[0, 1, 2].map((i) => (
        <g key={i} transform={`translate(${230 + i * 34} ${170 - i * 29.5}) rotate(-40)`}>
          <rect x="-15" y="-20" width="30" height="16" rx="3" fill="#a9b6c2" />
          <circle cx="-8" cy="-2" r="3.5" fill="#2a4258" />
          <circle cx="8" cy="-2" r="3.5" fill="#2a4258" />
        </g>
      ))}
      <path d="M122 244 V272 M146 244 V272" stroke="#5f7386" strokeWidth="2" />
      <circle cx="134" cy="276" r="8" fill="none" stroke="#a9b6c2" strokeWidth="2" />
      <rect x="122" y="286" width="24" height="12" rx="2" fill="#e08a00" />
      <text x="156" y="295" fill="#a9b6c2" fontFamily="monospace" fontSize="11">2:1 take-up</text>
      <text x="384" y="80" fill="#a9b6c2" fontFamily="monospace" fontSize="11">drive sprocket</text>
      <text x="246" y="118" fill="#f5c16c" fontFamily="monospace" fontSize="11">chain tension T(s, t)</text>
    </svg>
  );
}

export default async function LandingPage() {
  const user = await getCurrentUserIfAvailable();
  return (
    <div className="flex min-h-screen flex-col">
      <section className="bg-ink-950 text-steel-100">
        <div className="mx-auto flex max-w-6xl items-center justify-between px-6 py-5">
          <Logo tone="light" />
          {user ? (
            <ButtonLink href="/dashboard" size="sm" data-testid="open-workspace">
              Open workspace
            </ButtonLink>
          ) : (
            <ButtonLink href="/sign-in" size="sm" data-testid="landing-sign-in">
              Sign in
            </ButtonLink>
          )}
        </div>
        <div className="mx-auto grid max-w-6xl items-center gap-10 px-6 pb-16 pt-8 lg:grid-cols-[1.1fr_1fr]">
          <div>
            <p className="mb-3 font-mono text-[12px] font-semibold uppercase tracking-[0.18em] text-lamp-300">Chain-lift dynamics</p>
            <h1 className="text-[34px] font-extrabold leading-[1.12] tracking-tight text-paper sm:text-[42px]">
              Know what the chain does on the lift hill, before the train does.
            </h1>
            <p className="mt-5 max-w-xl text-[16px] leading-relaxed text-steel-300">
              Tautline is for the people who design, run and maintain roller-coaster chain lifts. It simulates the chain as spring
              segments with a weighted 2:1 gravity take-up, keeps your lifts, trains and scenarios with their runs, and replays
              each run on the hill.
            </p>
            <div className="mt-7 flex flex-wrap gap-3">
              <ButtonLink href={user ? "/dashboard" : "/sign-in"}>{user ? "Open workspace" : "Sign in to your organisation"}</ButtonLink>
              <Link href="#who" className="inline-flex h-10 items-center px-2 text-sm font-semibold text-steel-100 underline decoration-lamp-500 underline-offset-4">
                Who it is for
              </Link>
            </div>
          </div>
          <div className="rounded-xl border border-ink-800 bg-ink-900/60 p-3">
            <LiftSketch />
          </div>
        </div>
      </section>
      <section id="who" className="mx-auto w-full max-w-6xl px-6 py-14">
        <h2 className="text-[13px] font-semibold uppercase tracking-[0.14em] text-steel-500">Who uses Tautline</h2>
        <div className="mt-5 grid gap-5 md:grid-cols-3">
          {AUDIENCES.map((a) => (
            <div key={a.who} className="rounded-lg border border-steel-300/70 bg-white p-5">
              <h3 className="text-[16px] font-bold text-ink-950">{a.who}</h3>
              <p className="mt-2 text-[14px] leading-relaxed text-ink-800">{a.what}</p>
            </div>
          ))}
        </div>
        <p className="mt-8 max-w-3xl text-[14px] leading-relaxed text-steel-500">
          Accounts belong to an organisation — a park operator or a ride-engineering firm — and its administrator invites each
          person with a role: administrator, ride engineer, reviewer, operations &amp; maintenance, trainer or viewer.
        </p>
      </section>
      <footer className="mt-auto border-t border-steel-300/60">
        <div className="mx-auto max-w-6xl px-6 py-5">
          <SafetyNote />
        </div>
      </footer>
    </div>
  );
}
