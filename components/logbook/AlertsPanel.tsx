/** Open logbook alerts of the organisation, for the dashboard (server component, data passed in). */
import Link from "next/link";
import { Badge } from "@/components/ui/Badge";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import type { AlertJson } from "./types";
import { alertMessageIn } from "@/lib/alerts/words";
import type { UnitSystem } from "@/lib/client/units";

const TONE = { limit: "fail", warning: "caution", forecast: "lamp" } as const;

export function AlertsPanel({ alerts, units }: { alerts: AlertJson[]; units: UnitSystem }) {
  return (
    <Card data-testid="alerts-panel">
      <CardHeader title="Logbook alerts" description="Readings past a level, or a trend that reaches one inside the horizon." />
      <CardBody>
        {alerts.length === 0 ? (
          <p className="text-[13.5px] text-steel-500">No open alerts.</p>
        ) : (
          <ul className="space-y-2.5">
            {alerts.map((a) => (
              <li key={a.id} className="flex items-start gap-2.5 text-[13.5px]" data-testid="alert-item">
                <Badge tone={TONE[a.level as keyof typeof TONE] ?? "neutral"} className="mt-px">
                  {a.level}
                </Badge>
                <span>
                  <Link className="font-semibold text-ink-900 hover:underline" href={`/logbook?lift=${a.liftId}`}>
                    {a.liftName}
                  </Link>{" "}
                  <span className="text-steel-700">{alertMessageIn(a.message, units).replace(`${a.liftName}: `, "")}</span>
                  <span className="block text-[12px] text-steel-500">
                    {new Date(a.createdAt).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" })}
                    {a.emailedAt ? ` · e-mailed to ${a.recipients.length} engineer(s)` : " · not e-mailed"}
                  </span>
                </span>
              </li>
            ))}
          </ul>
        )}
      </CardBody>
    </Card>
  );
}
