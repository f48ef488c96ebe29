import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { AuthCard } from "@/components/auth/AuthCard";
import { SignInForm } from "@/components/auth/SignInForm";
import { Alert } from "@/components/ui/Alert";
import { getCurrentUserIfAvailable } from "@/lib/auth/session";
import { safeCallbackPath } from "@/lib/security/redirect";

export const metadata: Metadata = { title: "Sign in" };

type Search = Promise<Record<string, string | string[] | undefined>>;

const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);

export default async function SignInPage({ searchParams }: { searchParams: Search }) {
  const q = await searchParams;
  const callbackUrl = one(q.callbackUrl);
  // Someone with a valid, active session has nothing to do here.
  if (await getCurrentUserIfAvailable()) {
    redirect(safeCallbackPath(callbackUrl));
  }
  const notice = q.passwordChanged
    ? "Your password was changed. Sign in with the new one."
    : q.accepted
      ? "Your account is ready. Sign in with the password you chose."
      : q.reset
        ? "Your password was reset. Sign in with the new one."
        : q.signedOut
          ? "You are signed out."
          : null;
  return (
    <AuthCard title="Sign in to Tautline" lead="Use the e-mail address your organisation's administrator invited.">
      {notice && (
        <Alert tone="success" className="mb-4" testId="sign-in-notice">
          {notice}
        </Alert>
      )}
      <SignInForm callbackUrl={callbackUrl} initialError={one(q.error)} initialEmail={one(q.email)} />
    </AuthCard>
  );
}
