import { useLocalSearchParams } from "expo-router";
import { useState } from "react";
import { ActivityIndicator, View } from "react-native";
import { ScopeDriftNotice } from "@/components/report/scope-drift-notice";
import { ScopeView } from "@/components/report/scope-view";
import { when } from "@/components/ui/format";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ConfirmBox } from "@/components/ui/confirm-box";
import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { AppText } from "@/components/ui/text";
import { colors, space } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";
import { usePlan } from "@/hooks/queries/plan";
import { usePublishReport, useReport, useSiteReports } from "@/hooks/queries/reports";
import { publishReadiness } from "@/survey/report";
import { SiteSectionScreen } from "./site-section-screen";

export function SiteReportScreen() {
  return <SiteSectionScreen>{(site) => <ReportSection siteId={site.id} hasClient={Boolean(site.summary?.clientUserId)} />}</SiteSectionScreen>;
}

function ReportSection({ siteId, hasClient }: { siteId: string; hasClient: boolean }) {
  const me = useMe();
  const params = useLocalSearchParams<{ paid?: string }>();
  const reports = useSiteReports(siteId);
  const latest = reports.data?.[0];
  const view = useReport(latest?.id);
  const publish = usePublishReport(siteId);
  const manages = me.role === "admin" || me.role === "designer";

  if (reports.isPending) return <ActivityIndicator color={colors.slate800} aria-label="Loading" />;
  if (reports.isError) return <Banner tone="danger">{reports.error.message}</Banner>;

  return (
    <View style={{ gap: space.lg }}>
      {params.paid ? <Banner tone="good" title="Thank you">Your deposit payment was received by the payments provider; its status shows below once confirmed.</Banner> : null}
      {manages ? (
        <Card>
          <AppText variant="subheading">Publish for sign-off</AppText>
          <AppText muted>
            {hasClient
              ? "Publishing freezes the plan as it is now as a new version, with a fingerprint, and e-mails the homeowner a link to read and sign it."
              : "Invite the homeowner on the Rooms tab first; the scope is e-mailed to them."}
          </AppText>
          {latest ? <PlanSincePublished siteId={siteId} /> : null}
          {publish.error ? <Banner tone="danger">{publish.error.message}</Banner> : null}
          {publish.data ? <Banner tone="good">{`Version ${publish.data.report.version} published and e-mailed.`}</Banner> : null}
          <PublishButton siteId={siteId} nextVersion={(latest?.version ?? 0) + 1} disabled={!hasClient} publish={() => publish.mutateAsync(undefined)} busy={publish.isPending} />
          {reports.data.length ? (
            <View style={{ gap: 2 }}>
              {reports.data.map((r) => (
                <AppText key={r.id} variant="caption" muted>{`Version ${r.version} · published ${when(r.publishedAt)} · ${r.signedAt ? `signed ${when(r.signedAt)}` : "not signed"}`}</AppText>
              ))}
            </View>
          ) : null}
        </Card>
      ) : null}
      {!latest ? (
        <EmptyState
          icon={<Icon name="report" size={40} color={colors.slate600} />}
          title="Not published yet"
          body={me.role === "client" ? "Your installer has not published the scope yet. You get an e-mail when they do." : "Once the designer publishes the plan, the homeowner reads the scope here, asks for changes or signs it off."}
        />
      ) : view.isPending ? (
        <ActivityIndicator color={colors.slate800} aria-label="Loading" />
      ) : view.isError ? (
        <Banner tone="danger">{view.error.message}</Banner>
      ) : (
        <ScopeView view={view.data} isClient={me.role === "client"} />
      )}
    </View>
  );
}

/** For the team: whether the plan still matches the last published scope (the plan refreshes by itself). */
function PlanSincePublished({ siteId }: { siteId: string }) {
  const plan = usePlan(siteId);
  return plan.data ? <ScopeDriftNotice scope={plan.data.scope} /> : null;
}

/**
 * Publishing asks once more, listing what is still open in the plan (problems, devices left out or
 * with gaps, unpriced lines, an unchanged scope), because the homeowner reads and may sign it as it is.
 */
function PublishButton({ siteId, nextVersion, disabled, busy, publish }: { siteId: string; nextVersion: number; disabled: boolean; busy: boolean; publish: () => Promise<unknown> }) {
  const [asking, setAsking] = useState(false);
  const plan = usePlan(siteId).data;
  if (!asking) return <Button label={`Publish version ${nextVersion}`} busy={busy} disabled={disabled} onPress={() => setAsking(true)} style={{ alignSelf: "flex-start" }} />;
  const open = plan
    ? publishReadiness({
        problems: plan.summary.warningCounts.error,
        unpricedLines: plan.materials.unpricedCount,
        materialLines: plan.materials.lines.length,
        devicesWithGaps: plan.completeness.withGaps,
        devicesLeftOut: plan.completeness.leftOut,
        sincePublished: plan.scope ? { version: plan.scope.sinceVersion, changed: plan.scope.changed } : null,
      })
    : [];
  return (
    <ConfirmBox
      question={`Publish version ${nextVersion} and e-mail the homeowner?`}
      detail={!plan ? "Reading the plan…" : open.length ? "Still open:" : "Nothing is open in the plan."}
      confirmLabel="Yes, publish and e-mail"
      keepLabel="Not yet"
      // A refusal shows in the card's banner (publish.error).
      onConfirm={() => publish().catch(() => undefined)}
      onClose={() => setAsking(false)}
    >
      {open.length ? (
        <View role="list" aria-label="Still open before publishing" style={{ gap: 2 }}>
          {open.map((line) => (
            <AppText key={line} role="listitem">{`• ${line}`}</AppText>
          ))}
        </View>
      ) : null}
    </ConfirmBox>
  );
}
