import type { Metadata } from "next";
import { AuthCard } from "@/components/auth/AuthCard";
import { LinkProblem } from "@/components/auth/LinkProblem";
import { NewPasswordForm } from "@/components/auth/NewPasswordForm";
import { ROLE_LABELS, isRole } from "@/lib/auth/roles";
import { tokenSchema } from "@/lib/auth/schemas";
import { lookUpInvitation } from "@/lib/auth/accounts";

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
    const invitation = await lookUpInvitation(token);
    if (invitation.state !== "usable") {
      body = <LinkProblem state={invitation.state} mode="invite" />;
    } else {
      lead = `You are joining ${invitation.organisationName ?? "your organisation"} as ${isRole(invitation.role) ? ROLE_LABELS[invitation.role] : invitation.role}. Choose the password you will sign in with.`;
      body = <NewPasswordForm mode="invite" token={token} email={invitation.email} name={invitation.name} />;
    }
  }
  return (
    <AuthCard title="Join Tautline" lead={lead}>
      {body}
    </AuthCard>
  );
}
