// Whether this device has a connection now, as the browser and the query client both see it:
// either saying offline counts (the browser's flag changes even when no event arrives).
import { onlineManager } from "@tanstack/react-query";
import { useSyncExternalStore } from "react";

export function isOnlineNow(): boolean {
  return onlineManager.isOnline() && (typeof navigator === "undefined" || navigator.onLine !== false);
}

function subscribe(onChange: () => void): () => void {
  const unsubscribe = onlineManager.subscribe(onChange);
  if (typeof window !== "undefined") {
    window.addEventListener("online", onChange);
    window.addEventListener("offline", onChange);
  }
  return () => {
    unsubscribe();
    if (typeof window !== "undefined") {
      window.removeEventListener("online", onChange);
      window.removeEventListener("offline", onChange);
    }
  };
}

export function useOnline(): boolean {
  return useSyncExternalStore(subscribe, isOnlineNow, () => true);
}

