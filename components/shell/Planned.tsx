import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Badge } from "@/components/ui/Badge";

/** An area that a later release fills: says plainly what it will do and who it is for. */
export function Planned({ items, audience }: { items: string[]; audience: string }) {
  return (
    <Card data-testid="planned-area">
      <CardHeader title="What this area will do" description={audience} actions={<Badge tone="lamp">Planned</Badge>} />
      <CardBody>
        <ul className="grid gap-2 text-[14px] leading-relaxed text-ink-800 sm:grid-cols-2">
          {items.map((i) => (
            <li key={i} className="flex gap-2.5">
              <span aria-hidden className="mt-2 block h-px w-3 shrink-0 bg-lamp-500" />
              {i}
            </li>
          ))}
        </ul>
      </CardBody>
    </Card>
  );
}
