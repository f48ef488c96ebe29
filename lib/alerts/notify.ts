/**
 * Raises alerts: each kind stands open once per lift (unique `open_key`), so a crossing is e-mailed once to
 * the organisation's active ride engineers, through lib/mail. A mail failure is kept on the alert and never
 * fails the logbook entry that raised it.
 */
import { Op, UniqueConstraintError } from "sequelize";
import { sendMail } from "@/lib/mail/send";
import { getModels, type Alert } from "@/models";
import type { AlertCandidate } from "./evaluate";
import { alertMail } from "./mail";

export const openKey = (liftId: number, kind: string) => `${liftId}:${kind}`;

export async function raiseAlerts(p: { organisationId: number; liftId: number; liftName: string; entryId: number | null; candidates: AlertCandidate[] }): Promise<Alert[]> {
  const { Alert: AlertModel, User } = getModels();
  const raised: Alert[] = [];
  for (const c of p.candidates) {
    try {
      raised.push(
        await AlertModel.create({
          organisationId: p.organisationId,
          liftId: p.liftId,
          kind: c.kind,
          level: c.level,
          message: c.message,
          entryId: p.entryId,
          openKey: openKey(p.liftId, c.kind),
        }),
      );
    } catch (err) {
      if (err instanceof UniqueConstraintError) continue; // already open: mailed before
      throw err;
    }
  }
  if (!raised.length) return raised;
  const engineers = await User.findAll({ where: { organisationId: p.organisationId, role: "engineer", active: true }, order: [["id", "ASC"]] });
  const to = engineers.map((u) => u.email);
  for (const a of raised) {
    if (!to.length) {
      await a.update({ recipients: [], mailError: "The organisation has no active ride engineer to e-mail." });
      continue;
    }
    try {
      await sendMail(to.join(", "), alertMail({ liftName: p.liftName, liftId: p.liftId, message: a.message, level: a.level }));
      await a.update({ recipients: to, emailedAt: new Date() });
    } catch (err) {
      await a.update({ recipients: to, mailError: (err as Error).message });
    }
  }
  return raised;
}

/** Clears a lift's open alerts of the given kinds (e.g. take-up ones after links are removed). */
export async function clearAlerts(liftId: number, kinds: string[]): Promise<number> {
  const { Alert: AlertModel } = getModels();
  const [n] = await AlertModel.update(
    { openKey: null, clearedAt: new Date() },
    { where: { liftId, kind: { [Op.in]: kinds }, openKey: { [Op.ne]: null } } },
  );
  return n;
}

export interface AlertView {
  id: number;
  liftId: number;
  liftName: string;
  kind: string;
  level: string;
  message: string;
  createdAt: string;
  emailedAt: string | null;
  recipients: string[];
}

/** Open alerts of the actor's organisation, newest first (the dashboard panel). */
export async function openAlerts(organisationId: number, liftId?: number): Promise<AlertView[]> {
  const { Alert: AlertModel, Lift } = getModels();
  const rows = await AlertModel.findAll({
    where: { organisationId, openKey: { [Op.ne]: null }, ...(liftId ? { liftId } : {}) },
    order: [["createdAt", "DESC"], ["id", "DESC"]],
    limit: 50,
  });
  const lifts = new Map((await Lift.findAll({ where: { organisationId }, attributes: ["id", "name"] })).map((l) => [l.id, l.name]));
  return rows.map((a) => ({
    id: a.id,
    liftId: a.liftId,
    liftName: lifts.get(a.liftId) ?? `Lift ${a.liftId}`,
    kind: a.kind,
    level: a.level,
    message: a.message,
    createdAt: a.createdAt.toISOString(),
    emailedAt: a.emailedAt ? a.emailedAt.toISOString() : null,
    recipients: a.recipients ?? [],
  }));
}
