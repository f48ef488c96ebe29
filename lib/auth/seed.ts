import type { Sequelize } from "sequelize";
import { initModels } from "@/models";
import { hashPassword } from "./password";
import { DEMO_ACCOUNTS, DEMO_ORGANISATIONS, DEMO_PASSWORD } from "./demo-accounts";
import type { SeedStep } from "@/lib/db/seeds";

/**
 * Creates the demo organisations and one account per role (idempotent). Existing rows keep their
 * password, so re-seeding never undoes a change a demo user made; a missing password is restored.
 */
export async function seedDemoAccounts(sequelize: Sequelize): Promise<void> {
  const { Organisation, User } = initModels(sequelize);
  const orgIds = new Map<string, number>();
  for (const org of Object.values(DEMO_ORGANISATIONS)) {
    const [row] = await Organisation.findOrCreate({ where: { slug: org.slug }, defaults: { ...org } });
    orgIds.set(org.slug, row.id);
  }
  const hash = await hashPassword(DEMO_PASSWORD);
  for (const a of DEMO_ACCOUNTS) {
    const organisationId = orgIds.get(a.organisation)!;
    const [row, created] = await User.findOrCreate({
      where: { email: a.email },
      defaults: { email: a.email, name: a.name, role: a.role, organisationId, passwordHash: hash },
    });
    if (!created && !row.passwordHash) await row.update({ passwordHash: hash });
  }
}

export const demoAccountsSeed: SeedStep = { name: "demo organisations and accounts", run: seedDemoAccounts };
