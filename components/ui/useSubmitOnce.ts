"use client";
/**
 * One submit at a time: a second click while the first request is in flight does nothing (a create
 * never makes two rows, a save never answers 409 to its own second click). `busy` drives the button.
 * A send that answers "leaving" (it navigated to the new row) stays busy until the page goes.
 */
import { useCallback, useRef, useState } from "react";

export type SendOutcome = void | "leaving";

export function useSubmitOnce(): [busy: boolean, once: (send: () => Promise<SendOutcome>) => Promise<void>] {
  const inFlight = useRef(false);
  const [busy, setBusy] = useState(false);
  const once = useCallback(async (send: () => Promise<SendOutcome>) => {
    if (inFlight.current) return;
    inFlight.current = true;
    setBusy(true);
    let leaving = false;
    try {
      leaving = (await send()) === "leaving";
    } finally {
      if (!leaving) {
        inFlight.current = false;
        setBusy(false);
      }
    }
  }, []);
  return [busy, once];
}
