import type { Metadata } from "next";
import Link from "next/link";
import { NAV_ITEMS } from "@/components/shell/nav";
import { Badge } from "@/components/ui/Badge";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can, type Action } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { AlertsPanel } from "@/components/logbook/AlertsPanel";
import { openAlerts } from "@/lib/alerts/notify";
import { RecentRuns } from "@/components/dashboard/RecentRuns";
import { recentRuns } from "@/lib/runs/recent";

export const metadata: Metadata = { title: "Overview" };

const ABILITIES: Array<{ action: Action; text: string }> = [
  { action: "design:write", text: "Create and revise lifts, trains, chains and scenarios" },
  { action: "run:start", text: "Start runs of a scenario and cancel them" },
  { action: "comment:write", text: "Comment on scenarios and runs in review" },
  { action: "audit:read", text: "Read the audit trail of changes" },
  { action: "users:manage", text: "Invite people, change roles, deactivate accounts" },
  { action: "design:read", text: "Read every lift, train, scenario and run result" },
];

const GROUP_LABELS = { design: "Design", operate: "Operations", admin: "Admin" } as const;

export default async function DashboardPage() {
  const user = await pageUser("/dashboard");
  const alerts = can(user.role, "logbook:read") ? await openAlerts(user.organisationId) : [];
  const runs = can(user.role, "run:read") ? await recentRuns(user) : null;
  const areas = NAV_ITEMS.filter((i) => i.href !== "/dashboard" && (!i.action || can(user.role, i.action)));
  return (
    <>
      <PageHeader
        eyebrow="Overview"
        title={`Good to see you, ${user.name.split(" ")[0]}`}
        description="Tautline models a chain lift as spring segments with a weighted 2:1 gravity take-up, runs your load cases, and keeps the results beside the lift they belong to."
      />
      <div className="mb-5">
        <AlertsPanel alerts={alerts} units={user.units} />
      </div>
      {runs && (
        <div className="mb-5">
          <RecentRuns runs={runs} units={user.units} />
        </div>
      )}
      <div className="grid gap-5 lg:grid-cols-3">
        <Card className="lg:col-span-2">
          <CardHeader title="Your areas" description="Everything your role may open, and what each area is for." />
          <ul className="divide-y divide-steel-100" data-testid="dashboard-areas">
            {areas.map((a) => (
              <li key={a.href} className="flex items-start justify-between gap-4 px-5 py-3">
                <div>
                  <Link href={a.href} className="text-[14px] font-semibold text-ink-900 hover:text-lamp-600">
                    {a.label}
                  </Link>
                  <p className="text-[13px] text-steel-500">{a.purpose}</p>
                </div>
                <Badge tone={a.group === "admin" ? "neutral" : "lamp"}>{GROUP_LABELS[a.group]}</Badge>
              </li>
            ))}
          </ul>
        </Card>
        <Card>
          <CardHeader title="Your role" description={ROLE_LABELS[user.role]} />
          <CardBody>
            <ul className="space-y-2 text-[13.5px]" data-testid="role-abilities">
              {ABILITIES.map((a) => {
                const yes = can(user.role, a.action);
                return (
                  <li key={a.action} className="flex items-start gap-2.5">
                    <Badge tone={yes ? "pass" : "neutral"} className="mt-px w-9 justify-center">
                      {yes ? "Yes" : "No"}
                    </Badge>
                    <span className={yes ? "text-ink-900" : "text-steel-500"}>{a.text}</span>
                  </li>
                );
              })}
            </ul>
            <p className="mt-4 text-[12.5px] text-steel-500">
              Units on screen: <strong className="text-ink-800">{user.units === "si" ? "SI" : "US customary"}</strong>. Change them in the
              user menu or in <Link href="/settings" className="underline">Settings</Link>.
            </p>
          </CardBody>
        </Card>
      </div>
    </>
  );
}
