import type { Metadata } from "next";
import { AuthCard } from "@/components/auth/AuthCard";
import { LinkProblem } from "@/components/auth/LinkProblem";
import { NewPasswordForm } from "@/components/auth/NewPasswordForm";
import { tokenSchema } from "@/lib/auth/schemas";
import { findToken } from "@/lib/auth/tokens";

export const metadata: Metadata = { title: "Choose a new password" };

type Search = Promise<Record<string, string | string[] | undefined>>;

export default async function ResetPasswordPage({ searchParams }: { searchParams: Search }) {
  const raw = (await searchParams).token;
  const token = Array.isArray(raw) ? raw[0] : raw;
  let body: React.ReactNode;
  if (!token) body = <LinkProblem state="missing" mode="reset" />;
  else if (!tokenSchema.safeParse(token).success) body = <LinkProblem state="unknown" mode="reset" />;
  else {
    // Only looks at the token; it is used up when the form is sent.
    const found = await findToken(token, "reset");
    const user = found.row?.get("user") as { email: string; active: boolean } | undefined;
    if (found.state !== "usable" || !user?.active) body = <LinkProblem state={found.state === "usable" ? "unknown" : found.state} mode="reset" />;
    else body = <NewPasswordForm mode="reset" token={token} email={user.email} />;
  }
  return (
    <AuthCard title="Choose a new password" lead="Every session of this account ends when the password changes.">
      {body}
    </AuthCard>
  );
}
