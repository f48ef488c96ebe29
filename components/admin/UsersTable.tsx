"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import type { UserSummary } from "@/lib/auth/accounts";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/roles";
import { Alert } from "@/components/ui/Alert";
import { Badge, type Tone } from "@/components/ui/Badge";
import { Button } from "@/components/ui/Button";
import { Select } from "@/components/ui/Field";
import { submitJson } from "@/lib/client/fetch";
import { Table, Td, Th, THead, Tr } from "@/components/ui/Table";
import { useHydrated } from "@/components/ui/ClientForm";
import { ConfirmBar, type PendingAction } from "@/components/ui/ConfirmBar";
import { formatDate } from "@/lib/client/dates";

const STATUS_TONE: Record<UserSummary["status"], Tone> = { active: "pass", invited: "caution", deactivated: "neutral" };

function date(iso: string | null): string {
  return formatDate(iso, "utcDayTime", "never");
}

export function UsersTable({ users, meId }: { users: UserSummary[]; meId: number }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [busyId, setBusyId] = useState<number | null>(null);
  const [message, setMessage] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const [pending, setPending] = useState<PendingAction | null>(null);
  const ask = (question: string, confirmLabel: string, run: () => Promise<void>) =>
    setPending({ question, confirmLabel, run: () => void run().finally(() => setPending(null)) });

  async function act(id: number, url: string, method: "POST" | "PATCH" | "DELETE", body: unknown, done: string) {
    if (busyId !== null) return;
    setBusyId(id);
    setMessage(null);
    const res = await submitJson(url, method, body);
    setBusyId(null);
    if (!res.ok) return setMessage({ tone: "error", text: Object.values(res.errors)[0] ?? res.error ?? "Not changed." });
    setMessage({ tone: "success", text: done });
    router.refresh();
  }

  return (
    <div>
      {message && (
        <Alert tone={message.tone} className="mx-5 my-3" testId={message.tone === "success" ? "users-message" : "users-error"}>
          {message.text}
        </Alert>
      )}
      <ConfirmBar pending={pending} onCancel={() => setPending(null)} busy={busyId !== null} />
      <Table>
        <THead>
          <tr>
            <Th>Person</Th>
            <Th>Role</Th>
            <Th>Status</Th>
            <Th>Last sign-in</Th>
            <Th className="text-right">Actions</Th>
          </tr>
        </THead>
        <tbody data-testid="users-table" data-ready={hydrated ? "true" : "false"}>
          {users.map((u) => {
            const me = u.id === meId;
            return (
              <Tr key={u.id} data-testid={`user-row-${u.email}`}>
                <Td>
                  <p className="font-semibold">
                    {u.name} {me && <span className="font-normal text-steel-500">(you)</span>}
                  </p>
                  <p className="font-mono text-[12px] text-steel-500">{u.email}</p>
                </Td>
                <Td>
                  <Select
                    aria-label={`Role of ${u.name}`}
                    data-testid={`role-${u.email}`}
                    className="h-8 min-w-52 text-[13px]"
                    value={u.role}
                    disabled={!hydrated || me || busyId === u.id}
                    title={me ? "Another administrator must change your role." : undefined}
                    onChange={(e) => {
                      const role = e.target.value as Role;
                      ask(`Change ${u.name}'s role from ${ROLE_LABELS[u.role]} to ${ROLE_LABELS[role]}? It applies at their next request.`, "Change role", () =>
                        act(u.id, `/api/admin/users/${u.id}`, "PATCH", { role }, `${u.name} is now ${ROLE_LABELS[role]}.`),
                      );
                    }}
                  >
                    {ROLES.map((r) => (
                      <option key={r} value={r}>
                        {ROLE_LABELS[r]}
                      </option>
                    ))}
                  </Select>
                </Td>
                <Td>
                  <Badge tone={STATUS_TONE[u.status]}>{u.status}</Badge>
                </Td>
                <Td className="whitespace-nowrap font-mono text-[12px] text-steel-500">{date(u.lastSignInAt)}</Td>
                <Td className="space-x-2 text-right whitespace-nowrap">
                  {u.status === "invited" && (
                    <Button
                      size="sm"
                      variant="secondary"
                      busy={busyId === u.id}
                        disabled={!hydrated}
                      onClick={() => act(u.id, `/api/admin/users/${u.id}/invite`, "POST", undefined, `A new invitation went to ${u.email}.`)}
                    >
                      Send new link
                    </Button>
                  )}
                  {!me &&
                    (u.status === "deactivated" ? (
                      <Button
                        size="sm"
                        variant="secondary"
                        data-testid={`reactivate-${u.email}`}
                        busy={busyId === u.id}
                        disabled={!hydrated}
                        onClick={() => act(u.id, `/api/admin/users/${u.id}`, "PATCH", { active: true }, `${u.name} can sign in again.`)}
                      >
                        Reactivate
                      </Button>
                    ) : (
                      <Button
                        size="sm"
                        variant="danger"
                        data-testid={`deactivate-${u.email}`}
                        busy={busyId === u.id}
                        disabled={!hydrated}
                        onClick={() =>
                          ask(`Deactivate ${u.name} (${u.email})? They are signed out at once and cannot sign in until reactivated.`, "Deactivate", () =>
                            act(u.id, `/api/admin/users/${u.id}`, "PATCH", { active: false }, `${u.name} is deactivated and signed out.`),
                          )
                        }
                      >
                        Deactivate
                      </Button>
                    ))}
                </Td>
              </Tr>
            );
          })}
        </tbody>
      </Table>
    </div>
  );
}
