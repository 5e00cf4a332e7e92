"use client";

import { useEffect } from "react";

/**
 * While `active`, closing or reloading the tab asks first: leaving stops uploads in progress, and
 * a file whose upload was not completed has to be sent again.
 */
export function useLeaveGuard(active: boolean): void {
  useEffect(() => {
    if (!active) return;
    const onBeforeUnload = (event: BeforeUnloadEvent) => {
      event.preventDefault();
      event.returnValue = "";
    };
    window.addEventListener("beforeunload", onBeforeUnload);
    return () => window.removeEventListener("beforeunload", onBeforeUnload);
  }, [active]);
}
