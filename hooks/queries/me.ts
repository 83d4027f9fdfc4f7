import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { Role, TeamAction } from "@/survey/policy";
import { ApiError, OfflineError, apiFetch } from "@/sync/http";

export interface Me {
  user: { id: string; name: string | null; email: string };
  role: Role;
  team: { id: string; name: string; units: "metric" | "imperial" };
  permissions: Record<TeamAction, boolean>;
}

export type SessionState =
  | { status: "signed-in"; me: Me; offline: false }
  | { status: "signed-in"; me: Me; offline: true } // last known session, kept on this device
  | { status: "signed-out" };

export const meKeys = { root: ["me"] as const };

const CACHE_KEY = "dropwise.session.v1";

/** The last session this device saw (kept for offline use), or undefined. */
export function cachedMe(): Me | undefined {
  try {
    const raw = globalThis.localStorage?.getItem(CACHE_KEY);
    return raw ? (JSON.parse(raw) as Me) : undefined;
  } catch {
    return undefined;
  }
}

export function forgetCachedSession() {
  globalThis.localStorage?.removeItem(CACHE_KEY);
}

/** Who is signed in. Offline, a surveyor keeps working with the last session this device saw. */
export async function fetchSession(): Promise<SessionState> {
  try {
    const { session: me } = await apiFetch<{ session: Me | null }>("/api/session");
    if (!me) return { status: "signed-out" };
    globalThis.localStorage?.setItem(CACHE_KEY, JSON.stringify(me));
    return { status: "signed-in", me, offline: false };
  } catch (err) {
    if (err instanceof OfflineError) {
      const me = cachedMe();
      if (me) return { status: "signed-in", me, offline: true };
      return { status: "signed-out" };
    }
    if (err instanceof ApiError && (err.status === 401 || err.status === 403)) return { status: "signed-out" };
    throw err;
  }
}

export function useSession() {
  return useQuery({ queryKey: meKeys.root, queryFn: fetchSession, networkMode: "always", staleTime: 60_000, retry: false });
}

/** The signed-in user; only call under the signed-in layout. */
export function useMe(): Me {
  const { data } = useSession();
  if (data?.status !== "signed-in") throw new Error("useMe() used outside the signed-in area");
  return data.me;
}

export function useUpdateName() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => apiFetch<{ user: Me["user"] }>("/api/me", { method: "PATCH", body: { name } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: meKeys.root }),
  });
}
