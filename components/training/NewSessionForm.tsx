"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/Button";
import { Field, Input } from "@/components/ui/Field";
import { ApiError, sendJson } from "@/lib/client/fetch";
import { useSubmitOnce } from "@/components/ui/useSubmitOnce";

export function NewSessionForm() {
  const router = useRouter();
  const [title, setTitle] = useState("");
  const [error, setError] = useState<string | undefined>();
  const [busy, once] = useSubmitOnce();
  const create = () =>
    once(async () => {
      try {
        const s = await sendJson<{ id: number }>("/api/training/sessions", "POST", { title });
        router.push(`/replays/${s.id}/edit`);
        return "leaving";
      } catch (err) {
        setError(err instanceof ApiError ? (err.issues[0]?.message ?? err.message) : String(err));
      }
    });
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        void create();
      }}
    >
      <Field label="New session title" name="new-title" error={error} className="w-96">
        <Input id="new-title" value={title} onChange={(e) => setTitle(e.target.value)} />
      </Field>
      <Button type="submit" busy={busy} data-testid="create-session">
        Create a session
      </Button>
    </form>
  );
}
