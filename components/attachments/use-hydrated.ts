import { useSyncExternalStore } from "react";

const subscribe = () => () => undefined;

/** False in the server render and during hydration, true once React handles events. */
export function useHydrated(): boolean {
  return useSyncExternalStore(subscribe, () => true, () => false);
}
