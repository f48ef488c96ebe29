"use client";

import { useSyncExternalStore, type FormEvent, type ReactNode } from "react";
import { cx } from "./cx";

const subscribe = () => () => {};

/** False during server rendering and hydration, true once React runs in the browser. */
export function useHydrated(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => true,
    () => false,
  );
}

/**
 * A form whose controls stay disabled until React has hydrated, so nothing typed or clicked before
 * then is lost (the fields are controlled by React state) or sent as a plain HTML form.
 */
export function ClientForm({
  onSubmit,
  children,
  className,
  testId,
}: {
  onSubmit: (e: FormEvent<HTMLFormElement>) => void;
  children: ReactNode;
  className?: string;
  testId?: string;
}) {
  const hydrated = useHydrated();
  return (
    <form onSubmit={onSubmit} noValidate data-testid={testId} data-ready={hydrated ? "true" : "false"}>
      <fieldset disabled={!hydrated} className={cx("min-w-0 space-y-4", className)}>
        {children}
      </fieldset>
    </form>
  );
}
