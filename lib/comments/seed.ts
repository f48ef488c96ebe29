import type { Sequelize } from "sequelize";
import { initModels } from "@/models";
import type { SeedStep } from "@/lib/db/seeds";
import { DEMO_ORGANISATIONS, demoAccount } from "@/lib/auth/demo-accounts";

/** The demo reviewer's note on the park's first scenario, so a new user sees what a review comment looks like. */
export const DEMO_REVIEW_COMMENT =
  "Reviewed the pick-up: dog engagement speed and snatch factor look reasonable for this chain. " +
  "Before sign-off, replace the assumed chain stiffness with the manufacturer's data-sheet value and re-run.";

export async function seedDemoReviewComment(sequelize: Sequelize): Promise<void> {
  const { Comment, Organisation, Scenario, User } = initModels(sequelize);
  const park = await Organisation.findOne({ where: { slug: DEMO_ORGANISATIONS.park.slug } });
  const reviewer = await User.findOne({ where: { email: demoAccount("reviewer").email } });
  if (!park || !reviewer) return;
  const first = await Scenario.findOne({ where: { organisationId: park.id }, order: [["id", "ASC"]] });
  if (!first) return;
  await Comment.findOrCreate({
    where: { scenarioId: first.id, userId: reviewer.id, body: DEMO_REVIEW_COMMENT },
    defaults: { organisationId: park.id, scenarioId: first.id, runId: null, userId: reviewer.id, body: DEMO_REVIEW_COMMENT },
  });
}

export const demoReviewCommentSeed: SeedStep = { name: "demo park: a review comment", run: seedDemoReviewComment };
