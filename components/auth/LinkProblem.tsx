import Link from "next/link";
import { Alert } from "@/components/ui/Alert";

const TEXT = {
  missing: "This page needs the link from your e-mail. Open the e-mail and use its link, whole.",
  unknown: "This link is not valid. Copy the whole link from the e-mail.",
  used: "This link was already used. Each link works once.",
  expired: "This link has expired.",
} as const;

export function LinkProblem({ state, mode }: { state: keyof typeof TEXT; mode: "invite" | "reset" }) {
  return (
    <div className="space-y-4">
      <Alert tone="error" testId="link-problem" title="The link cannot be used">
        {TEXT[state]}{" "}
        {mode === "invite" ? "Ask your organisation's administrator to send a new invitation." : "Ask for a new reset link."}
      </Alert>
      <p className="text-center text-[13px]">
        <Link href={mode === "invite" ? "/sign-in" : "/forgot-password"} className="underline">
          {mode === "invite" ? "Go to sign-in" : "Ask for a new reset link"}
        </Link>
      </p>
    </div>
  );
}
