import { useLocalSearchParams } from "expo-router";
import { EmptyState } from "@/components/ui/empty-state";
import { Icon, type IconName } from "@/components/ui/icons";
import { Screen } from "@/components/ui/screen";
import { colors } from "@/constants/theme";
import { SiteTabs } from "./site-tabs";

export function SiteSectionScreen({ title, icon, emptyTitle, emptyBody }: { title: string; icon: IconName; emptyTitle: string; emptyBody: string }) {
  const { id } = useLocalSearchParams<{ id: string }>();
  return (
    <Screen title={title}>
      <SiteTabs siteId={id} />
      <EmptyState icon={<Icon name={icon} size={40} color={colors.slate600} />} title={emptyTitle} body={emptyBody} />
    </Screen>
  );
}
