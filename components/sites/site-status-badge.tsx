import { Badge } from "@/components/ui/badge";
import type { SiteStatus } from "@/hooks/queries/sites";
import { SITE_STATUS_LABELS } from "@/survey/team";

const TONE = { surveying: "neutral", planning: "copper", out_for_sign_off: "warn", signed: "good", changes_asked: "danger" } as const;

export function SiteStatusBadge({ status }: { status: SiteStatus }) {
  // A status this app version does not know yet (from a newer server) still shows, in plain words.
  return <Badge label={SITE_STATUS_LABELS[status] ?? String(status).replace(/_/g, " ")} tone={TONE[status] ?? "neutral"} />;
}
