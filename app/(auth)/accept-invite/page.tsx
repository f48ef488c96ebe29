import type { Metadata } from "next";
import { AuthCard } from "@/components/auth/AuthCard";
import { LinkProblem } from "@/components/auth/LinkProblem";
import { NewPasswordForm } from "@/components/auth/NewPasswordForm";
import { ROLE_LABELS, isRole } from "@/lib/auth/roles";
import { tokenSchema } from "@/lib/auth/schemas";
import { findToken } from "@/lib/auth/tokens";
import { getModels } from "@/models";

export const metadata: Metadata = { title: "Accept invitation" };

type Search = Promise<Record<string, string | string[] | undefined>>;

export default async function AcceptInvitePage({ searchParams }: { searchParams: Search }) {
  const raw = (await searchParams).token;
  const token = Array.isArray(raw) ? raw[0] : raw;
  let lead = "Choose the password you will sign in with.";
  let body: React.ReactNode;
  if (!token) body = <LinkProblem state="missing" mode="invite" />;
  else if (!tokenSchema.safeParse(token).success) body = <LinkProblem state="unknown" mode="invite" />;
  else {
    const found = await findToken(token, "invite");
    const user = found.row?.get("user") as
      | { email: string; name: string; role: string; active: boolean; passwordHash: string | null; organisationId: number }
      | undefined;
    if (found.state !== "usable" || !user?.active || user.passwordHash) {
      body = <LinkProblem state={found.state === "usable" ? "used" : found.state} mode="invite" />;
    } else {
      const org = await getModels().Organisation.findByPk(user.organisationId);
      lead = `You are joining ${org?.name ?? "your organisation"} as ${isRole(user.role) ? ROLE_LABELS[user.role] : user.role}. Choose the password you will sign in with.`;
      body = <NewPasswordForm mode="invite" token={token} email={user.email} name={user.name} />;
    }
  }
  return (
    <AuthCard title="Join Tautline" lead={lead}>
      {body}
    </AuthCard>
  );
}
