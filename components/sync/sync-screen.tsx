import { Redirect } from "expo-router";
import { useEffect, useState } from "react";
import { StyleSheet, View } from "react-native";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { ProgressBar } from "@/components/ui/progress-bar";
import { Screen } from "@/components/ui/screen";
import { AppText } from "@/components/ui/text";
import { myConflicts, shownPhase, SYNC_PHASE_TONES, SYNC_PHASE_WORDS, waitingWords } from "@/components/walk/sync-pill";
import { colors, fonts, radius, space } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";
import { useSiteItems, useLocalSites, useSyncNotices, useSyncState } from "@/hooks/use-local-store";
import { useOnline } from "@/hooks/use-online";
import { describeValue, fieldWord } from "@/survey/walk/describe";
import type { ConflictNote, Rejection } from "@/sync/protocol";

const PHASE_EXPLAINED = {
  "saved-on-phone": "Everything you captured is kept on this phone. It is sent, and the office's changes fetched, as soon as there is a connection.",
  sending: "Sending your changes and photos, and fetching what others changed.",
  "up-to-date": "This phone and the office have the same walk.",
  "needs-you": "Something needs you: read what is below.",
} as const;

/** "just now", "4 min ago", "today at 14:05", or a date. */
export function syncedWhen(at: number | null, now = Date.now()): string {
  if (at === null) return "not yet on this phone";
  const s = Math.max(0, Math.round((now - at) / 1000));
  if (s < 45) return "just now";
  if (s < 3600) return `${Math.round(s / 60)} min ago`;
  const d = new Date(at);
  const time = d.toLocaleTimeString(undefined, { hour: "2-digit", minute: "2-digit" });
  return new Date(now).toDateString() === d.toDateString() ? `today at ${time}` : `${d.toLocaleDateString()} at ${time}`;
}

export function SyncScreen() {
  const me = useMe();
  // A homeowner keeps nothing on the phone: there is nothing to sync.
  if (me.role === "client") return <Redirect href="/" />;
  return <TeamSync userId={me.user.id} />;
}

function TeamSync({ userId }: { userId: string }) {
  const sync = useSyncState();
  const notices = useSyncNotices();
  const conflictsMine = myConflicts(notices.data?.conflicts ?? [], userId);
  const phase = shownPhase(sync, (notices.data?.rejections.length ?? 0) + conflictsMine.length);
  const tone = SYNC_PHASE_TONES[phase];
  const waiting = waitingWords(sync.pending, sync.photosWaiting);
  const now = useNow(30_000);
  const online = useOnline();
  const rejections = notices.data?.rejections ?? [];
  const conflicts = conflictsMine;

  return (
    <Screen title="Sync" subtitle="What this phone holds and what has reached the office.">
      <Card role="region" aria-label="Sync state">
        <View style={styles.stateRow}>
          <View style={[styles.dot, { backgroundColor: tone.dot }]} />
          <AppText variant="heading" style={{ color: tone.fg }}>
            {SYNC_PHASE_WORDS[phase]}
          </AppText>
        </View>
        <AppText>{PHASE_EXPLAINED[phase]}</AppText>
        {!online ? <Banner tone="warn" title="No connection">This phone is offline: what you capture is kept here and sent by itself when the connection is back.</Banner> : null}
        {sync.problem ? <Banner tone={sync.phase === "needs-you" ? "danger" : "warn"}>{sync.problem}</Banner> : null}
        <View style={styles.facts}>
          <Fact label="Changes to send" value={String(sync.pending)} />
          <Fact label="Photos waiting" value={String(sync.photosWaiting)} />
          <Fact label="Last synced" value={syncedWhen(sync.lastSyncedAt, now)} />
        </View>
        {sync.uploading ? (
          <View style={{ gap: space.xs }}>
            <AppText variant="label">{`Uploading a photo · ${Math.round(sync.uploading.progress * 100)} %`}</AppText>
            <ProgressBar value={sync.uploading.progress} label="Photo upload" />
          </View>
        ) : null}
        <Button label="Send now" busy={sync.phase === "sending"} onPress={() => void sync.syncNow()} style={{ alignSelf: "flex-start" }} />
        {waiting && sync.phase !== "sending" ? (
          <AppText muted variant="caption">{`${waiting}. Nothing is lost while you wait.`}</AppText>
        ) : null}
      </Card>

      {rejections.length || conflicts.length ? (
        <View style={{ gap: space.md }} role="list" aria-label="Notices">
          {rejections.map((r) => (
            <RejectionNotice key={r.mutationId} rejection={r} onDismiss={() => notices.dismiss({ rejections: [r.mutationId] })} />
          ))}
          {conflicts.map((c) => (
            <ConflictNotice key={c.id} conflict={c} userId={userId} onDismiss={() => notices.dismiss({ conflicts: [c.id] })} />
          ))}
        </View>
      ) : (
        <EmptyState icon={<Icon name="sync" size={40} color={colors.slate600} />} title="Nothing needs you" body="Changes the office refused and values another surveyor replaced are shown here once, with the reason." />
      )}
    </Screen>
  );
}

/** The time, refreshed every `ms`, so "4 min ago" stays true while the screen is open. */
function useNow(ms: number): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const t = setInterval(() => setNow(Date.now()), ms);
    return () => clearInterval(t);
  }, [ms]);
  return now;
}

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.fact} aria-label={`${label}: ${value}`}>
      <AppText variant="caption" muted>
        {label}
      </AppText>
      <AppText style={styles.factValue}>{value}</AppText>
    </View>
  );
}

function RejectionNotice({ rejection, onDismiss }: { rejection: Rejection; onDismiss: () => void }) {
  return (
    <View role="listitem" style={[styles.notice, { borderLeftColor: colors.danger }]}>
      <AppText style={{ fontFamily: fonts.bold, color: colors.danger }}>A change was refused</AppText>
      <AppText>{rejection.message}</AppText>
      <AppText variant="caption" muted>
        The rest of your changes went through. Fix this one on the walk if it still matters.
      </AppText>
      <Button tone="secondary" label="Dismiss" aria-label={`Dismiss: ${rejection.message}`} onPress={onDismiss} style={{ alignSelf: "flex-start" }} />
    </View>
  );
}

function ConflictNotice({ conflict, userId, onDismiss }: { conflict: ConflictNote; userId: string; onDismiss: () => void }) {
  const items = useSiteItems(conflict.siteId);
  const sites = useLocalSites();
  const units = sites.data?.find((s) => s.id === conflict.siteId)?.units ?? "metric";
  const item = items.data?.find((i) => i.id === conflict.itemId);
  const itemName = typeof item?.data.name === "string" ? item.data.name : "an item that was deleted";
  const text = `Your value ${describeValue(conflict.field, conflict.lostValue, units)} for ${fieldWord(conflict.field)} was replaced by ${describeValue(conflict.field, conflict.keptValue, units)} from ${conflict.keptBy === userId ? "another of your devices" : "another surveyor"}.`;
  return (
    <View role="listitem" style={[styles.notice, { borderLeftColor: colors.copper500 }]}>
      <AppText style={{ fontFamily: fonts.bold, color: colors.copper700 }}>{`Your value was replaced: ${itemName}`}</AppText>
      <AppText>{text}</AppText>
      <Button tone="secondary" label="Dismiss" aria-label={`Dismiss: ${text}`} onPress={onDismiss} style={{ alignSelf: "flex-start" }} />
    </View>
  );
}

const styles = StyleSheet.create({
  stateRow: { flexDirection: "row", alignItems: "center", gap: space.sm },
  dot: { width: 14, height: 14, borderRadius: 7 },
  facts: { flexDirection: "row", flexWrap: "wrap", gap: space.md },
  fact: { minWidth: 140, flexGrow: 1, padding: space.md, backgroundColor: colors.slate50, borderRadius: radius.md, gap: 2 },
  factValue: { fontFamily: fonts.bold, fontSize: 18 },
  notice: { gap: space.sm, padding: space.lg, backgroundColor: colors.card, borderRadius: radius.lg, borderWidth: 1, borderColor: colors.line, borderLeftWidth: 5 },
});
