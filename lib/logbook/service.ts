/**
 * Logbook domain: entries per lift (validated, computed values stored beside the raw ones), the trend
 * with forecasts, per-lift levels, and the alerts an entry raises. Conventions as in lib/lifts: permission
 * first, another organisation's lift is 404, every problem listed with its field path, nothing stored on 400.
 */
import { Op, type WhereOptions } from "sequelize";
import { assertCan, type Actor } from "@/lib/http/actor";
import { assertVersion } from "@/lib/http/concurrency";
import { conflict, zodIssues } from "@/lib/http/errors";
import { validate, throwIfIssues } from "@/lib/http/validate";
import { recordAudit } from "@/lib/audit/record";
import { getSequelize } from "@/lib/db/sequelize";
import { evaluateAlerts } from "@/lib/alerts/evaluate";
import { clearAlerts, openAlerts, raiseAlerts, type AlertView } from "@/lib/alerts/notify";
import { getModels, type LogbookEntry, type LogbookSetting } from "@/models";
import { loadLiftContext, type LiftContext } from "./context";
import { MIN_FORECAST_READINGS, forecastCrossing, type Forecast, type ForecastStatus } from "./forecast";
import { elongationPercent, takeUpLimits, takeUpReset } from "./measure";
import { DEFAULT_SETTINGS, entryDateSchema, entryInputSchema, entryListQuery, settingsInputSchema } from "./schema";

export interface EntryView {
  id: number;
  liftId: number;
  liftRevisionId: number;
  kind: LogbookEntry["kind"];
  measuredAt: string;
  userId: number | null;
  userName: string | null;
  data: Record<string, unknown>;
  elongationPercent: number | null;
  takeUpPosition: number | null;
  notes: string | null;
  photos: { id: number; url: string; name: string }[];
}

export interface SettingsView {
  elongationLimit: number;
  elongationWarning: number;
  takeUpWarning: number;
  horizonDays: number;
  version: number;
}

async function settingsOf(ctx: LiftContext): Promise<SettingsView> {
  const row = await getModels().LogbookSetting.findOne({ where: { liftId: ctx.lift.id } });
  return row ? settingsView(row) : { ...DEFAULT_SETTINGS, version: 0 };
}

function settingsView(r: LogbookSetting): SettingsView {
  return { elongationLimit: r.elongationLimit, elongationWarning: r.elongationWarning, takeUpWarning: r.takeUpWarning, horizonDays: r.horizonDays, version: r.version };
}

async function entryViews(rows: LogbookEntry[]): Promise<EntryView[]> {
  const { User, Upload } = getModels();
  const userIds = [...new Set(rows.map((r) => r.userId).filter((x): x is number => x !== null))];
  const users = new Map((userIds.length ? await User.findAll({ where: { id: userIds }, attributes: ["id", "name"] }) : []).map((u) => [u.id, u.name]));
  const ids = rows.map((r) => r.id);
  const photos = ids.length ? await Upload.findAll({ where: { entryId: ids, kind: "photo" }, order: [["id", "ASC"]] }) : [];
  return rows.map((r) => ({
    id: r.id,
    liftId: r.liftId,
    liftRevisionId: r.liftRevisionId,
    kind: r.kind,
    measuredAt: r.measuredAt.toISOString(),
    userId: r.userId,
    userName: r.userId ? (users.get(r.userId) ?? null) : null,
    data: r.data,
    elongationPercent: r.elongationPercent,
    takeUpPosition: r.takeUpPosition,
    notes: r.notes,
    photos: photos.filter((p) => p.entryId === r.id).map((p) => ({ id: p.id, url: `/api/uploads/${p.id}`, name: p.originalName })),
  }));
}

export interface Trend {
  liftId: number;
  liftName: string;
  settings: SettingsView;
  pitch: number;
  travel: number;
  takeUp: { limit: number; warning: number; thermalReserve: number; elasticExcursion: number | null; source: string };
  elongation: { points: { at: string; value: number }[]; latest: number | null; forecast: ForecastView | null };
  takeUpSeries: {
    points: { at: string; value: number }[];
    latest: number | null;
    since: string | null;
    forecast: ForecastView | null;
    /** Readings before the latest links removal: drawn for context, not part of the trend. */
    earlier: { at: string; value: number }[];
    /** When links were removed (each one resets the take-up). */
    resets: string[];
  };
  alerts: AlertView[];
}

export interface ForecastView {
  /** Why there is (or is no) crossing date; the chart and the words follow it. */
  status: ForecastStatus;
  /** Readings needed before a date is given (MIN_FORECAST_READINGS). */
  minimumReadings: number;
  searchYears: number;
  crossing: string | null;
  earliest: string | null;
  latest: string | null;
  slopePerDay: number;
  residualSd: number | null;
  points: number;
  reached: boolean;
  line: { at: string; value: number; lower: number; upper: number }[];
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);
function forecastView(f: Forecast | null): ForecastView | null {
  if (!f) return null;
  return {
    status: f.status,
    minimumReadings: MIN_FORECAST_READINGS,
    searchYears: f.searchYears,
    crossing: iso(f.crossing),
    earliest: iso(f.crossingEarliest),
    latest: iso(f.crossingLatest),
    slopePerDay: f.slopePerDay,
    residualSd: f.residualSd,
    points: f.points,
    reached: f.reached,
    line: f.line.map((p) => ({ at: p.at.toISOString(), value: p.value, lower: p.lower, upper: p.upper })),
  };
}

async function buildTrend(ctx: LiftContext, organisationId: number): Promise<Trend> {
  const { LogbookEntry } = getModels();
  const settings = await settingsOf(ctx);
  const rows = await LogbookEntry.findAll({
    where: { liftId: ctx.lift.id, kind: { [Op.in]: ["elongation", "take-up", "links-removed"] } },
    order: [["measuredAt", "ASC"], ["id", "ASC"]],
  });
  const el = rows.filter((r) => r.kind === "elongation" && r.elongationPercent !== null).map((r) => ({ at: r.measuredAt, value: r.elongationPercent! }));
  // Removing links resets the take-up: its trend starts again after the latest removal.
  const lastRemoval = [...rows].reverse().find((r) => r.kind === "links-removed");
  const after = (r: LogbookEntry) => !lastRemoval || r.measuredAt >= lastRemoval.measuredAt;
  const readings = rows.filter((r) => r.kind === "take-up" && r.takeUpPosition !== null);
  const tu = readings.filter(after).map((r) => ({ at: r.measuredAt, value: r.takeUpPosition! }));
  const earlier = readings.filter((r) => !after(r)).map((r) => ({ at: r.measuredAt.toISOString(), value: r.takeUpPosition! }));
  const resets = rows.filter((r) => r.kind === "links-removed").map((r) => r.measuredAt.toISOString());
  const lim = takeUpLimits(ctx.travel, ctx.thermalReserve, settings.takeUpWarning);
  return {
    liftId: ctx.lift.id,
    liftName: ctx.lift.name,
    settings,
    pitch: ctx.pitch,
    travel: ctx.travel,
    takeUp: { ...lim, thermalReserve: ctx.thermalReserve, elasticExcursion: ctx.elasticExcursion, source: ctx.staticsSource },
    elongation: {
      points: el.map((p) => ({ at: p.at.toISOString(), value: p.value })),
      latest: el.length ? el[el.length - 1].value : null,
      forecast: forecastView(forecastCrossing(el, settings.elongationLimit)),
    },
    takeUpSeries: {
      points: tu.map((p) => ({ at: p.at.toISOString(), value: p.value })),
      latest: tu.length ? tu[tu.length - 1].value : null,
      since: lastRemoval ? lastRemoval.measuredAt.toISOString() : null,
      forecast: forecastView(forecastCrossing(tu, lim.limit)),
      earlier,
      resets,
    },
    alerts: await openAlerts(organisationId, ctx.lift.id),
  };
}

export async function getTrend(actor: Actor, liftId: number): Promise<Trend> {
  assertCan(actor, "logbook:read");
  return buildTrend(await loadLiftContext(actor, liftId), actor.organisationId);
}

type CreatedEntry = { entry: EntryView; alerts: AlertView[]; computed: Record<string, unknown>; replayed?: true };

/** A retried write (same Idempotency-Key) answered from the row the first one committed. */
async function replayOf(actor: Actor, key: string | undefined, liftId: number, kind: string): Promise<CreatedEntry | null> {
  if (!key) return null;
  const row = await getModels().LogbookEntry.findOne({ where: { userId: actor.id, idempotencyKey: key } });
  if (!row) return null;
  if (row.liftId !== liftId || row.kind !== kind)
    throw conflict("This Idempotency-Key was already used for a different logbook entry; send a new key for a new entry.");
  const [view] = await entryViews([row]);
  return { entry: view, alerts: [], computed: row.data, replayed: true };
}

export async function createEntry(actor: Actor, input: unknown, options: { idempotencyKey?: string } = {}): Promise<CreatedEntry> {
  assertCan(actor, "logbook:write");
  const liftId = (input as { liftId?: unknown } | null)?.liftId;
  // Another organisation's lift is 404 whatever else the body says.
  const ctx = typeof liftId === "number" && Number.isInteger(liftId) && liftId > 0 ? await loadLiftContext(actor, liftId) : null;
  const parsed = entryInputSchema.safeParse(input);
  const date = entryDateSchema.safeParse({ measuredAt: (input as { measuredAt?: unknown } | null)?.measuredAt });
  if (!parsed.success || !date.success) {
    // Every problem at once: the union stops at a missing kind, the date is checked apart.
    const issues = [...(parsed.success ? [] : zodIssues(parsed.error)), ...(date.success ? [] : zodIssues(date.error))];
    throwIfIssues(issues.filter((i, n) => issues.findIndex((j) => j.path === i.path && j.message === i.message) === n));
  }
  const body = parsed.data!;
  if (!ctx) throw new Error("unreachable: liftId validated");
  const key = options.idempotencyKey;
  const replay = await replayOf(actor, key, ctx.lift.id, body.kind);
  if (replay) return replay;
  const { LogbookEntry, Upload } = getModels();
  const measuredAt = body.measuredAt ?? new Date();
  if (measuredAt.getTime() > Date.now() + 5 * 60_000) throwIfIssues([{ path: "measuredAt", message: "must not be in the future" }]);
  let data: Record<string, unknown> = {};
  let elong: number | null = null;
  let pos: number | null = null;
  switch (body.kind) {
    case "elongation": {
      const pitch = body.nominalPitch ?? ctx.pitch;
      elong = elongationPercent(body.measuredLength, body.pitches, pitch);
      if (elong < -1 || elong > 20)
        throwIfIssues([{ path: "measuredLength", message: `gives ${elong.toFixed(2)} % elongation against ${body.pitches} × ${(pitch * 1000).toFixed(2)} mm: check the length and the number of pitches` }]);
      data = { measuredLength: body.measuredLength, pitches: body.pitches, nominalPitch: pitch };
      break;
    }
    case "take-up":
      if (body.position > ctx.travel) throwIfIssues([{ path: "position", message: `must be within the take-up travel of ${ctx.travel} m` }]);
      pos = body.position;
      data = { position: body.position };
      break;
    case "links-removed": {
      const before = await LogbookEntry.findOne({ where: { liftId: ctx.lift.id, kind: "take-up", measuredAt: { [Op.lte]: measuredAt } }, order: [["measuredAt", "DESC"], ["id", "DESC"]] });
      const reset = takeUpReset(body.links, ctx.pitch, before?.takeUpPosition ?? null);
      data = { links: body.links, pitch: ctx.pitch, ...reset, positionBefore: before?.takeUpPosition ?? null };
      break;
    }
    case "lubrication":
      data = { lubricant: body.lubricant ?? null };
      break;
    case "inspection": {
      const ids = body.photoIds ?? [];
      if (ids.length) {
        const found = await Upload.findAll({ where: { id: ids, organisationId: actor.organisationId, kind: "photo", entryId: { [Op.is]: null } } });
        const missing = ids.filter((id) => !found.some((f) => f.id === id));
        throwIfIssues(missing.map((id) => ({ path: `photoIds.${ids.indexOf(id)}`, message: `photo ${id} was not found or is already attached` })));
      }
      data = { findings: body.findings, photoIds: ids };
      break;
    }
  }
  let entry: LogbookEntry;
  try {
    entry = await getSequelize().transaction(async (transaction) => {
      const row = await LogbookEntry.create(
        {
          idempotencyKey: key ?? null,
          organisationId: actor.organisationId,
          liftId: ctx.lift.id,
          liftRevisionId: ctx.revision.id,
          kind: body.kind,
          measuredAt,
          userId: actor.id,
          data,
          elongationPercent: elong,
          takeUpPosition: pos,
          notes: body.notes ?? null,
        },
        { transaction },
      );
      if (body.kind === "inspection" && body.photoIds?.length)
        await Upload.update({ entryId: row.id, liftId: ctx.lift.id }, { where: { id: body.photoIds, organisationId: actor.organisationId }, transaction });
      await recordAudit({ transaction, actor, entity: "logbook-entry", entityId: row.id, action: "create", after: { kind: row.kind, liftId: row.liftId, data } });
      return row;
    });
  } catch (err) {
    // The same key sent twice at once: the unique index lets one through; the other answers from it.
    const raced = (err as Error).name === "SequelizeUniqueConstraintError" ? await replayOf(actor, key, ctx.lift.id, body.kind) : null;
    if (raced) return raced;
    throw err;
  }
  if (body.kind === "links-removed") await clearAlerts(ctx.lift.id, ["take-up-limit", "take-up-warning", "take-up-forecast"]);
  const trend = await buildTrend(ctx, actor.organisationId);
  const candidates = evaluateAlerts({
    liftName: ctx.lift.name,
    now: new Date(),
    horizonDays: trend.settings.horizonDays,
    elongation: {
      latest: trend.elongation.latest,
      warning: trend.settings.elongationWarning,
      limit: trend.settings.elongationLimit,
      forecast: trend.elongation.forecast?.crossing ? new Date(trend.elongation.forecast.crossing) : null,
    },
    takeUp: {
      latest: trend.takeUpSeries.latest,
      warning: trend.takeUp.warning,
      limit: trend.takeUp.limit,
      forecast: trend.takeUpSeries.forecast?.crossing ? new Date(trend.takeUpSeries.forecast.crossing) : null,
    },
  });
  const raised = await raiseAlerts({ organisationId: actor.organisationId, liftId: ctx.lift.id, liftName: ctx.lift.name, entryId: entry.id, candidates });
  const [view] = await entryViews([entry]);
  const all = await openAlerts(actor.organisationId, ctx.lift.id);
  return { entry: view, alerts: all.filter((a) => raised.some((r) => r.id === a.id)), computed: data };
}

export async function listEntries(actor: Actor, query: unknown): Promise<{ items: EntryView[]; total: number; page: number; pageSize: number }> {
  assertCan(actor, "logbook:read");
  const q = validate(entryListQuery, query);
  const ctx = await loadLiftContext(actor, q.liftId);
  const where: WhereOptions = {
    liftId: ctx.lift.id,
    ...(q.kind ? { kind: q.kind } : {}),
    ...(q.from || q.to ? { measuredAt: { ...(q.from ? { [Op.gte]: q.from } : {}), ...(q.to ? { [Op.lte]: q.to } : {}) } } : {}),
  };
  const { LogbookEntry } = getModels();
  const { rows, count } = await LogbookEntry.findAndCountAll({ where, order: [["measuredAt", "DESC"], ["id", "DESC"]], limit: q.pageSize, offset: (q.page - 1) * q.pageSize });
  return { items: await entryViews(rows), total: count, page: q.page, pageSize: q.pageSize };
}

export async function updateSettings(actor: Actor, liftId: number, input: unknown): Promise<SettingsView> {
  assertCan(actor, "logbook:settings");
  const ctx = await loadLiftContext(actor, liftId);
  const body = validate(settingsInputSchema, input);
  const { LogbookSetting } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const row = await LogbookSetting.findOne({ where: { liftId: ctx.lift.id }, transaction, lock: transaction.LOCK.UPDATE });
    assertVersion(row?.version ?? 0, body.version, "logbook settings");
    const values = { elongationLimit: body.elongationLimit, elongationWarning: body.elongationWarning, takeUpWarning: body.takeUpWarning, horizonDays: body.horizonDays };
    const saved = row
      ? await row.update({ ...values, version: row.version + 1 }, { transaction })
      : await LogbookSetting.create({ organisationId: actor.organisationId, liftId: ctx.lift.id, ...values, version: 1 }, { transaction });
    await recordAudit({ transaction, actor, entity: "logbook-settings", entityId: ctx.lift.id, action: row ? "update" : "create", after: values });
    return settingsView(saved);
  });
}
