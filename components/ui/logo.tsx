// Dropwise's mark: a closet box with one copper cable dropping out of it and ending in a port.
import { View } from "react-native";
import Svg, { Circle, Path, Rect } from "react-native-svg";
import { colors, fonts } from "@/constants/theme";
import { AppText } from "./text";

export function LogoMark({ size = 36, onDark = false }: { size?: number; onDark?: boolean }) {
  return (
    <Svg width={size} height={size} viewBox="0 0 40 40" aria-hidden>
      <Rect x={2} y={2} width={36} height={36} rx={10} fill={onDark ? colors.slate700 : colors.slate800} />
      <Rect x={9} y={8} width={22} height={8} rx={2.5} fill="none" stroke={colors.onDark} strokeWidth={2.4} />
      <Path d="M20 16v7.5c0 2.5 1.5 3.8 4 3.8" fill="none" stroke={colors.copper500} strokeWidth={3} strokeLinecap="round" />
      <Circle cx={27.5} cy={27.3} r={3.6} fill={colors.copper500} />
    </Svg>
  );
}

export function Wordmark({ onDark = false }: { onDark?: boolean }) {
  return (
    <View style={{ flexDirection: "row", alignItems: "center", gap: 10 }} aria-label="Dropwise">
      <LogoMark onDark={onDark} />
      <AppText style={{ fontFamily: fonts.heavy, fontSize: 21, color: onDark ? colors.onDark : colors.slate800, letterSpacing: -0.2 }}>
        Dropwise
      </AppText>
    </View>
  );
}
