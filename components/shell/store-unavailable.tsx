import { View } from "react-native";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { space } from "@/constants/theme";

/** The phone's store for the walk could not be opened in this tab: say why, and how to go on. */
export function StoreUnavailable({ inAnotherTab, message }: { inAnotherTab: boolean; message: string }) {
  return (
    <View style={{ gap: space.lg, maxWidth: 560, width: "100%" }}>
      {inAnotherTab ? (
        <Banner tone="warn" title="Dropwise is open in another tab">
          This browser keeps the walk in one tab at a time. Use the other tab, or close it and press Try again here. Nothing saved is lost.
        </Banner>
      ) : (
        <Banner tone="danger" title="This browser cannot keep a walk offline">{message}</Banner>
      )}
      <Button label="Try again" onPress={() => window.location.reload()} style={{ alignSelf: "flex-start" }} />
    </View>
  );
}
