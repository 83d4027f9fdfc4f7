import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { Role, TeamRole } from "@/survey/policy";
import type { InviteMemberInput } from "@/survey/team";
import { apiFetch } from "@/sync/http";

export interface Member {
  id: string;
  name: string | null;
  email: string;
  role: Role;
}
export interface PendingInvite {
  id: string;
  email: string;
  role: TeamRole;
  expiresAt: string;
}
export interface CapturedMail {
  id: string;
  to: string;
  subject: string;
  text: string;
  links: string[];
  receivedAt: string;
}

export const teamKeys = {
  root: ["team"] as const,
  members: () => [...teamKeys.root, "members"] as const,
  outbox: () => [...teamKeys.root, "outbox"] as const,
};

/** How often an open team screen looks again, so someone who just joined shows up without a reload. */
export const MEMBERS_REFRESH_MS = 15_000;

export function useTeamMembers(enabled = true) {
  return useQuery({
    queryKey: teamKeys.members(),
    queryFn: () => apiFetch<{ members: Member[]; invites: PendingInvite[] }>("/api/team/members"),
    enabled,
    // Who is on the team changes from elsewhere (an invitation accepted): never trust a kept copy.
    staleTime: 0,
    refetchInterval: MEMBERS_REFRESH_MS,
    refetchIntervalInBackground: false,
  });
}

export function useOutbox(enabled = true) {
  return useQuery({ queryKey: teamKeys.outbox(), queryFn: () => apiFetch<{ mail: CapturedMail[] }>("/api/outbox").then((r) => r.mail), enabled, refetchInterval: 5000 });
}

function useTeamMutation<V>(fn: (vars: V) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: fn, onSettled: () => qc.invalidateQueries({ queryKey: teamKeys.root }) });
}

export const useInviteMember = () => useTeamMutation((input: InviteMemberInput) => apiFetch("/api/team/invites", { body: input }));
export const useRevokeInvite = () => useTeamMutation((id: string) => apiFetch(`/api/team/invites/${id}`, { method: "DELETE" }));
export const useRemoveMember = () => useTeamMutation((id: string) => apiFetch(`/api/team/members/${id}`, { method: "DELETE" }));

export function useChangeRole() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, role }: { id: string; role: TeamRole }) => apiFetch(`/api/team/members/${id}`, { method: "PATCH", body: { role } }),
    onMutate: async ({ id, role }) => {
      await qc.cancelQueries({ queryKey: teamKeys.members() });
      const previous = qc.getQueryData<{ members: Member[]; invites: PendingInvite[] }>(teamKeys.members());
      if (previous) qc.setQueryData(teamKeys.members(), { ...previous, members: previous.members.map((m) => (m.id === id ? { ...m, role } : m)) });
      return { previous };
    },
    onError: (_e, _v, ctx) => {
      if (ctx?.previous) qc.setQueryData(teamKeys.members(), ctx.previous);
    },
    onSettled: () => qc.invalidateQueries({ queryKey: teamKeys.root }),
  });
}
