import type { Metadata } from "next";
import Link from "next/link";
import { AuthCard } from "@/components/auth/AuthCard";
import { ForgotPasswordForm } from "@/components/auth/ForgotPasswordForm";

export const metadata: Metadata = { title: "Forgot password" };

export default function ForgotPasswordPage() {
  return (
    <AuthCard
      title="Reset your password"
      lead="Enter the e-mail address you sign in with. If it has an active account, we send a link that works once, within one hour."
      footer={<Link href="/sign-in" className="underline">Back to sign-in</Link>}
    >
      <ForgotPasswordForm />
    </AuthCard>
  );
}
