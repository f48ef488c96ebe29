"use client";
/** The two trend cards (elongation, take-up at rest) with their forecasts in words, and the open alerts. */
import { Alert } from "@/components/ui/Alert";
import { Badge } from "@/components/ui/Badge";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { MIN_FORECAST_READINGS } from "@/lib/logbook/forecast";
import { TrendChart } from "./TrendChart";
import { day, type ForecastJson, type Len, type TrendJson } from "./types";
import { alertMessageIn } from "@/lib/alerts/words";

/** Why a trend has no date, in words (the minimum of readings and its reason are the forecast's own). */
function noForecastWords(f: ForecastJson | null, readings: number): string {
  const min = f?.minimumReadings ?? MIN_FORECAST_READINGS;
  if (!f || f.status === "too-few")
    return `No forecast yet: ${readings} of the ${min} readings needed. With fewer, the scatter of the readings cannot be estimated well enough for a 95 % interval to mean anything.`;
  if (f.status === "no-trend") return `No forecast: the ${f.points} readings show no change beyond their own scatter.`;
  if (f.status === "away") return `No forecast: the ${f.points} readings move away from the level.`;
  return `No forecast: at the present rate the level is not reached within ${f.searchYears} years.`;
}

export function TrendCards({ trend, len }: { trend: TrendJson; len: Len }) {
  const ef = trend.elongation.forecast;
  const tf = trend.takeUpSeries.forecast;
  return (
    <div className="grid gap-5 lg:grid-cols-2">
      <Card>
        <CardHeader title="Chain elongation" description={`Replacement limit ${trend.settings.elongationLimit} % (common practice for roller chain, no source), warning ${trend.settings.elongationWarning} %.`} />
        <CardBody className="space-y-2">
          <TrendChart title="Elongation, %" unit="%" scale={1} digits={2} points={trend.elongation.points} forecast={ef} limit={trend.settings.elongationLimit} warning={trend.settings.elongationWarning} testId="elongation-chart" />
          <p className="text-[13.5px]" data-testid="elongation-forecast">
            {ef?.crossing ? `Reaches ${trend.settings.elongationLimit} % around ${day(ef.crossing)} (95 %: ${day(ef.earliest)} – ${day(ef.latest)}), from ${ef.points} readings.` : noForecastWords(ef, trend.elongation.points.length)}
          </p>
        </CardBody>
      </Card>
      <Card>
        <CardHeader
          title="Take-up at rest"
          description={`Usable travel ${(trend.takeUp.limit * len.scale).toFixed(len.digits)} ${len.unit} of ${(trend.travel * len.scale).toFixed(len.digits)} ${len.unit}, keeping ${(trend.takeUp.thermalReserve * len.scale).toFixed(len.digits)} ${len.unit} for heat (from ${trend.takeUp.source}).`}
        />
        <CardBody className="space-y-2">
          <TrendChart title={`Position below the top stop, ${len.unit}`} unit={len.unit} scale={len.scale} digits={len.digits} points={trend.takeUpSeries.points} earlier={trend.takeUpSeries.earlier} resets={trend.takeUpSeries.resets} forecast={tf} limit={trend.takeUp.limit} warning={trend.takeUp.warning} testId="take-up-chart" />
          <p className="text-[13.5px]" data-testid="take-up-forecast">
            {tf?.crossing ? `Runs out of travel around ${day(tf.crossing)} (95 %: ${day(tf.earliest)} – ${day(tf.latest)}), from ${tf.points} readings.` : noForecastWords(tf, trend.takeUpSeries.points.length)}
            {trend.takeUpSeries.since ? ` Readings since links were removed on ${day(trend.takeUpSeries.since)}.` : ""}
          </p>
          {trend.takeUp.elasticExcursion !== null && (
            <p className="text-[12.5px] text-steel-500">The weight drops about {(trend.takeUp.elasticExcursion * len.scale).toFixed(len.digits)} {len.unit} when a train loads the chain (and creeps back up as it climbs): keep that much room below it.</p>
          )}
        </CardBody>
      </Card>
      {trend.alerts.length > 0 && (
        <div className="lg:col-span-2">
          <Alert tone="caution" title="Open alerts">
            <ul>
              {trend.alerts.map((a) => (
                <li key={a.id}>
                  <Badge tone={a.level === "limit" ? "fail" : "caution"}>{a.level}</Badge> {alertMessageIn(a.message, len.unit === "in" ? "us" : "si")}
                </li>
              ))}
            </ul>
          </Alert>
        </div>
      )}
    </div>
  );
}
