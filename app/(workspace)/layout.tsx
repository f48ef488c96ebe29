import { redirect } from "next/navigation";
import type { ReactNode } from "react";
import { AppShell } from "@/components/shell/AppShell";
import { getCurrentUser } from "@/lib/auth/session";
import { organisationName } from "@/lib/auth/accounts";

export const dynamic = "force-dynamic";

/** Every workspace page sits in this frame. Each page still checks its own access (lib/auth/page-guard.ts). */
export default async function WorkspaceLayout({ children }: { children: ReactNode }) {
  const user = await getCurrentUser();
  if (!user) redirect("/sign-in");
  return (
    <AppShell user={user} organisationName={(await organisationName(user.organisationId)) ?? ""}>
      {children}
    </AppShell>
  );
}
