import { useLocalSearchParams } from "expo-router";
import { ActivityIndicator, View } from "react-native";
import { ScopeDriftNotice } from "@/components/report/scope-drift-notice";
import { ScopeView } from "@/components/report/scope-view";
import { when } from "@/components/ui/format";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { AppText } from "@/components/ui/text";
import { colors, space } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";
import { usePlan } from "@/hooks/queries/plan";
import { usePublishReport, useReport, useSiteReports } from "@/hooks/queries/reports";
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
          <Button label={latest ? `Publish version ${latest.version + 1}` : "Publish version 1"} busy={publish.isPending} disabled={!hasClient} onPress={() => publish.mutate(undefined)} />
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
