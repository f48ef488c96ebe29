"use client";
/**
 * The one form hook of the editors: a draft checked on every change with the server's own zod schema,
 * every message at once beside its field and in words (label and unit, never a dotted path), the server's
 * 400 issues shown the same way, and a submit that runs once at a time (a second click while the first
 * is in flight does nothing, so a create never makes two rows and a save never answers 409 to itself).
 */
import { useMemo, useRef, useState } from "react";
import type { ZodType } from "zod";
import { ApiError } from "@/lib/client/fetch";
import { fieldErrors, type FieldLabel } from "@/lib/client/field-messages";
import type { UnitSystem } from "@/lib/client/units";
import { setPath, type Draft } from "./form-draft";
import type { SendOutcome } from "./useSubmitOnce";

export interface SchemaForm {
  draft: Draft;
  setDraft: (update: (d: Draft) => Draft) => void;
  /** Sets one field, marks it touched and clears the server's message for it. */
  set: (path: string, value: unknown) => void;
  /** Every current problem, by path, in words. */
  errors: Record<string, string>;
  /** The message to show beside a field now (after it was touched, or after a submit). */
  shown: (path: string) => string | undefined;
  busy: boolean;
  /** The server's messages for paths no field shows (for the banner). */
  unplaced: string[];
  /**
   * Runs `send` once the draft is valid and no submit is in flight. Returns "invalid" (messages now
   * shown), "rejected" (the server's 400 issues now shown beside their fields) or "done"; other errors
   * are thrown to the caller.
   */
  submit: (send: () => Promise<SendOutcome>) => Promise<"invalid" | "rejected" | "done" | "busy">;
  /** After a save: nothing touched, messages only as they arise. */
  settle: () => void;
}

export function useSchemaForm({
  schema,
  initial,
  fields,
  units,
  prepare = (d) => d,
  also,
}: {
  schema: ZodType;
  initial: () => Draft;
  fields: readonly FieldLabel[];
  units: UnitSystem;
  /** The draft as the schema reads it (e.g. empty notes → null). */
  prepare?: (d: Draft) => unknown;
  /** Rules between fields checked even while single fields are wrong (all messages at once). */
  also?: (d: Draft) => ReadonlyArray<{ path: string; message: string }>;
}): SchemaForm {
  const [draft, setDraftState] = useState<Draft>(initial);
  const [touched, setTouched] = useState<Set<string>>(new Set());
  const [showAll, setShowAll] = useState(false);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const inFlight = useRef(false);

  const errors = useMemo(() => {
    const r = schema.safeParse(prepare(draft));
    return fieldErrors([...(r.success ? [] : r.error.issues), ...(also?.(draft) ?? [])], fields, units);
    // `prepare` and `fields` are fixed per form.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [draft, schema, units]);

  const set = (path: string, value: unknown) => {
    setDraftState((d) => setPath(d, path, value));
    setTouched((t) => new Set(t).add(path));
    setServerErrors((e) => (path in e ? Object.fromEntries(Object.entries(e).filter(([k]) => k !== path)) : e));
  };

  async function submit(send: () => Promise<SendOutcome>) {
    if (inFlight.current) return "busy" as const;
    if (Object.keys(errors).length) {
      setShowAll(true);
      return "invalid" as const;
    }
    inFlight.current = true;
    setBusy(true);
    let leaving = false;
    try {
      // A create that navigates to the new row stays busy until the page goes.
      leaving = (await send()) === "leaving";
      return "done" as const;
    } catch (err) {
      if (err instanceof ApiError && err.status === 400 && err.issues.length) {
        setServerErrors(fieldErrors(err.issues, fields, units));
        setShowAll(true);
        return "rejected" as const;
      }
      throw err;
    } finally {
      if (!leaving) {
        inFlight.current = false;
        setBusy(false);
      }
    }
  }

  return {
    draft,
    setDraft: setDraftState,
    set,
    errors,
    shown: (p) => serverErrors[p] ?? (showAll || touched.has(p) ? errors[p] : undefined),
    busy,
    unplaced: Object.entries(serverErrors)
      .filter(([p]) => !fields.some((f) => f.path === p))
      .map(([, m]) => m),
    submit,
    settle: () => {
      setTouched(new Set());
      setShowAll(false);
    },
  };
}
