import type { Transaction } from "sequelize";
import { getModels } from "@/models";
import type { AuditAction, AuditEntry } from "@/models/AuditEntry";
import { snapshot } from "./snapshot";

/** Who acted: a signed-in user (the requireUser() shape), or the system (`id: null`) for one organisation. */
export interface AuditActor {
  id: number | null;
  organisationId: number;
}

export interface AuditInput {
  /** The transaction of the change itself, so the entry is written if and only if the change is. */
  transaction: Transaction;
  actor: AuditActor;
  /** Singular snake_case name of what changed: "lift", "chain_spec", "train", "scenario", "run", "comment". */
  entity: string;
  entityId: number | string;
  action: AuditAction;
  /** State before the change (null for create/import); a model instance or plain object. */
  before?: unknown;
  /** State after the change (null for delete). */
  after?: unknown;
}

/** Writes one audit entry inside the caller's transaction. */
export async function recordAudit(input: AuditInput): Promise<AuditEntry> {
  const { AuditEntry } = getModels();
  return AuditEntry.create(
    {
      organisationId: input.actor.organisationId,
      userId: input.actor.id,
      entity: input.entity,
      entityId: String(input.entityId),
      action: input.action,
      before: snapshot(input.before),
      after: snapshot(input.after),
      at: new Date(),
    },
    { transaction: input.transaction },
  );
}
