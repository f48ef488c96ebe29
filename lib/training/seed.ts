/** A shared demo replay session of the invented park: two saved runs with captions. Idempotent by title. */
import type { Sequelize } from "sequelize";
import type { SeedStep } from "@/lib/db/seeds";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { DEMO_PARK } from "@/lib/demo/park";
import { initModels } from "@/models";

const TITLE = "Why trains settle back onto the ARD";

export async function seedDemoTraining(sequelize: Sequelize): Promise<void> {
  const m = initModels(sequelize);
  const org = await m.Organisation.findOne({ where: { slug: DEMO_PARK.slug } });
  if (!org) return;
  if (await m.TrainingSession.count({ where: { organisationId: org.id, title: TITLE } })) return;
  const trainer = await m.User.findOne({ where: { email: demoAccount("trainer").email } });
  const byName = async (name: string) => {
    const s = await m.Scenario.findOne({ where: { organisationId: org.id, name } });
    return s ? m.Run.findOne({ where: { scenarioId: s.id, status: "done" }, order: [["id", "ASC"]] }) : null;
  };
  const clean = await byName("Emberline: clean pick-up");
  const ard = await byName("Emberline: too fast at the pick-up, settles back onto the ARD");
  const runs = [clean, ard].filter((r): r is NonNullable<typeof r> => r !== null);
  if (!runs.length) return;
  await sequelize.transaction(async (transaction) => {
    const s = await m.TrainingSession.create(
      { organisationId: org.id, title: TITLE, description: "A clean pick-up first, then a train that arrives too fast and rests on the ARD.", createdBy: trainer?.id ?? null, sharedAt: new Date() },
      { transaction },
    );
    const captions = [
      [
        { at: 2, text: "The drive ramps up: watch the counterweight rise as the chain tightens." },
        { at: 6, text: "Pick-up: the dog takes the train and the chain stretches." },
      ],
      [
        { at: 3, text: "The train arrives faster than the chain and runs ahead of the dogs." },
        { at: 8, text: "Watch the counterweight drop here, as the train settles back onto the ARD." },
      ],
    ];
    for (const [position, run] of runs.entries()) {
      const item = await m.TrainingItem.create({ sessionId: s.id, runId: run.id, position, title: null }, { transaction });
      await m.TrainingCaption.bulkCreate(captions[position].map((c) => ({ itemId: item.id, ...c })), { transaction });
    }
  });
}

export const demoTrainingSeed: SeedStep = { name: "demo park: a shared replay session", run: seedDemoTraining };
