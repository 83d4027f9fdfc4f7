import { Link } from "expo-router";
import { Pressable, StyleSheet, View } from "react-native";
import { AppText } from "@/components/ui/text";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";
import { useSyncNotices, useSyncState } from "@/hooks/use-local-store";
import { useOnline } from "@/hooks/use-online";
import type { ConflictNote } from "@/sync/protocol";
import type { SyncPhase } from "@/sync/sync-runner";

export const SYNC_PHASE_WORDS: Record<SyncPhase, string> = {
  "saved-on-phone": "saved on this phone",
  sending: "sending",
  "up-to-date": "up to date",
  "needs-you": "needs you",
};

export const SYNC_PHASE_TONES: Record<SyncPhase, { bg: string; fg: string; dot: string }> = {
  "saved-on-phone": { bg: colors.copper100, fg: colors.copper700, dot: colors.copper600 },
  sending: { bg: colors.slate50, fg: colors.slate800, dot: colors.slate600 },
  "up-to-date": { bg: colors.goodBg, fg: colors.good, dot: colors.good },
  "needs-you": { bg: colors.dangerBg, fg: colors.danger, dot: colors.danger },
};

/** "3 changes and 1 photo to send", or null when nothing waits. */
export function waitingWords(pending: number, photos: number): string | null {
  const parts: string[] = [];
  if (pending) parts.push(pending === 1 ? "1 change" : `${pending} changes`);
  if (photos) parts.push(photos === 1 ? "1 photo" : `${photos} photos`);
  return parts.length ? `${parts.join(" and ")} to send` : null;
}

/** Lost values are shown to the person whose value was replaced. */
export function myConflicts(conflicts: readonly ConflictNote[], userId: string): ConflictNote[] {
  return conflicts.filter((c) => c.lostBy === null || c.lostBy === userId);
}

/** Refused changes and the surveyor's own replaced values, not seen yet. */
export function useNoticeCount(): number {
  const me = useMe();
  const notices = useSyncNotices();
  return (notices.data?.rejections.length ?? 0) + myConflicts(notices.data?.conflicts ?? [], me.user.id).length;
}

/**
 * The state the surveyor is shown. Unread notices need them as much as a problem does; and before
 * the first round of this session has reached the office, nothing is confirmed "up to date" yet.
 */
export function shownPhase(sync: { phase: SyncPhase; lastSyncedAt: number | null }, notices: number): SyncPhase {
  if (notices > 0) return "needs-you";
  if (sync.phase === "up-to-date" && sync.lastSyncedAt === null) return "saved-on-phone";
  return sync.phase;
}

/** The sync state in a few words; opens the sync screen. */
export function SyncPill() {
  const sync = useSyncState();
  const notices = useNoticeCount();
  const phase = shownPhase(sync, notices);
  const tone = SYNC_PHASE_TONES[phase];
  const waiting = [waitingWords(sync.pending, sync.photosWaiting), notices ? (notices === 1 ? "1 notice to read" : `${notices} notices to read`) : null].filter(Boolean).join(", ") || null;
  const online = useOnline();
  // Offline, nothing can be "up to date" or "sending": say so; what waits is still counted.
  const words = !online && (phase === "up-to-date" || phase === "sending") ? "offline" : !online ? `${SYNC_PHASE_WORDS[phase]} · offline` : SYNC_PHASE_WORDS[phase];
  const label = `Sync: ${words}${waiting ? `, ${waiting}` : ""}`;
  return (
    <Link href="/sync" asChild>
      <Pressable role="link" aria-label={label} style={StyleSheet.flatten([styles.pill, { backgroundColor: tone.bg }])}>
        <View style={[styles.dot, { backgroundColor: tone.dot }]} />
        <AppText style={[styles.text, { color: tone.fg }]} numberOfLines={1}>
          {words}
          {waiting ? <AppText style={[styles.count, { color: tone.fg }]}>{` · ${waiting}`}</AppText> : null}
        </AppText>
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  pill: { flexDirection: "row", alignItems: "center", alignSelf: "flex-start", gap: space.sm, minHeight: minTouch - 8, paddingHorizontal: space.md, borderRadius: radius.pill, maxWidth: "100%" },
  dot: { width: 10, height: 10, borderRadius: 5 },
  text: { fontFamily: fonts.bold, fontSize: 14, flexShrink: 1 },
  count: { fontFamily: fonts.semibold, fontSize: 14 },
});
