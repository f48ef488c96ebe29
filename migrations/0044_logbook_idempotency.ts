import { DataTypes, type QueryInterface } from "sequelize";

/**
 * A logbook write may carry the client's Idempotency-Key: a retry after a lost answer (e.g. the database
 * connection dropped just after the commit) finds the committed row instead of writing a second one.
 * Unique per user; rows without a key (NULL) are not constrained.
 */
export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn("logbook_entries", "idempotency_key", { type: DataTypes.STRING(100), allowNull: true });
  // Key first, so this index never stands in for the one behind the user_id foreign key (down can drop it).
  await q.addIndex("logbook_entries", ["idempotency_key", "user_id"], { unique: true, name: "logbook_entries_idempotency" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeIndex("logbook_entries", "logbook_entries_idempotency");
  await q.removeColumn("logbook_entries", "idempotency_key");
}
