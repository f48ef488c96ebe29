import type { Sequelize } from "sequelize";
import { initModels } from "@/models";
import type { SeedStep } from "@/lib/db/seeds";
import { STANDARD_CHAINS } from "./standard";

/**
 * Creates (or brings up to date) the shared standard chain rows, matched by designation. Idempotent.
 * Lift revisions copy chain values, so correcting a standard row never changes an existing revision.
 */
export async function seedStandardChains(sequelize: Sequelize): Promise<void> {
  const { ChainSpec } = initModels(sequelize);
  await sequelize.transaction(async (transaction) => {
    for (const c of STANDARD_CHAINS) {
      const row = await ChainSpec.findOne({ where: { organisationId: null, designation: c.designation }, transaction });
      if (!row) {
        await ChainSpec.create({ ...c, organisationId: null, archivedAt: null, createdBy: null }, { transaction });
        continue;
      }
      const changed = (Object.keys(c) as (keyof typeof c)[]).some((k) => row[k] !== c[k]);
      if (changed) await row.update({ ...c, version: row.version + 1 }, { transaction });
    }
  });
}

export const standardChainsSeed: SeedStep = { name: "standard chain catalogue", run: seedStandardChains };
