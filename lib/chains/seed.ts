import type { Sequelize } from "sequelize";
import { initModels } from "@/models";
import type { SeedStep } from "@/lib/db/seeds";
import { STANDARD_CHAINS } from "./standard";
import { DEMO_ORGANISATIONS } from "@/lib/auth/demo-accounts";

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

// Reference data no one edits (shared rows): kept current on every start.
export const standardChainsSeed: SeedStep = { name: "standard chain catalogue", run: seedStandardChains, everyStart: true };

/**
 * The demo park's own catalogue entry: the kind of chain an operator types in from its manufacturer's
 * data sheet. Invented values (those of the scenario format's example lift chain), named as such.
 */
export const DEMO_PARK_CHAIN = {
  designation: "Lanternfell heavy lift chain (demo data sheet)",
  pitch: 0.1016,
  massPerLength: 15,
  axialStiffness: 1.5e7,
  breakingStrength: 5.0e5,
  source: "Invented demo data sheet (no real manufacturer): the scenario format's example lift chain",
  note: "Demo values for trying the catalogue; replace with your chain manufacturer's data sheet.",
} as const;

export async function seedDemoParkChain(sequelize: Sequelize): Promise<void> {
  const { ChainSpec, Organisation } = initModels(sequelize);
  const park = await Organisation.findOne({ where: { slug: DEMO_ORGANISATIONS.park.slug } });
  if (!park) return;
  await ChainSpec.findOrCreate({
    where: { organisationId: park.id, designation: DEMO_PARK_CHAIN.designation },
    defaults: { ...DEMO_PARK_CHAIN, organisationId: park.id, archivedAt: null, createdBy: null },
  });
}

export const demoParkChainSeed: SeedStep = { name: "demo park: own chain catalogue entry", run: seedDemoParkChain };
