// Line icons drawn for Dropwise (24×24 grid, 2 px strokes).
import Svg, { Circle, Path, Rect } from "react-native-svg";
import { colors } from "@/constants/theme";

export type IconName = "sites" | "sync" | "account" | "team" | "desk" | "rooms" | "plan" | "report" | "mail" | "back" | "plus" | "photo" | "check" | "gap" | "device";

interface IconProps {
  name: IconName;
  size?: number;
  color?: string;
}

export function Icon({ name, size = 24, color = colors.ink }: IconProps) {
  const stroke = { stroke: color, strokeWidth: 2, fill: "none", strokeLinecap: "round", strokeLinejoin: "round" } as const;
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24" aria-hidden>
      {name === "sites" && (
        <>
          <Path d="M3 11 12 4l9 7" {...stroke} />
          <Path d="M5.5 9.5V20h13V9.5" {...stroke} />
          <Path d="M10 20v-5h4v5" {...stroke} />
        </>
      )}
      {name === "sync" && (
        <>
          <Path d="M20 8a8 8 0 0 0-14.5-2.5M4 4v3.5h3.5" {...stroke} />
          <Path d="M4 16a8 8 0 0 0 14.5 2.5M20 20v-3.5h-3.5" {...stroke} />
        </>
      )}
      {name === "account" && (
        <>
          <Circle cx={12} cy={8.5} r={4} {...stroke} />
          <Path d="M4.5 20a7.5 7.5 0 0 1 15 0" {...stroke} />
        </>
      )}
      {name === "team" && (
        <>
          <Circle cx={9} cy={9} r={3.2} {...stroke} />
          <Circle cx={16.5} cy={10} r={2.6} {...stroke} />
          <Path d="M3 19.5a6 6 0 0 1 12 0M14.5 15.2a5 5 0 0 1 6.5 4.3" {...stroke} />
        </>
      )}
      {name === "desk" && (
        <>
          <Rect x={3} y={4} width={18} height={13} rx={2} {...stroke} />
          <Path d="M8 21h8M12 17v4M7 9h4M7 12h7" {...stroke} />
        </>
      )}
      {name === "rooms" && (
        <>
          <Rect x={3.5} y={3.5} width={17} height={17} rx={1.5} {...stroke} />
          <Path d="M12 3.5V13M12 16.5v4M3.5 12H9" {...stroke} />
        </>
      )}
      {name === "plan" && (
        <>
          <Circle cx={6} cy={6} r={2.2} {...stroke} />
          <Circle cx={18} cy={6} r={2.2} {...stroke} />
          <Circle cx={12} cy={18} r={2.2} {...stroke} />
          <Path d="M7.6 7.6 10.6 16M16.4 7.6 13.4 16M8.2 6h7.6" {...stroke} />
        </>
      )}
      {name === "report" && (
        <>
          <Path d="M6 3h8l4 4v14H6z" {...stroke} />
          <Path d="M14 3v4h4M9 12h6M9 15.5h6M9 19h3" {...stroke} />
        </>
      )}
      {name === "mail" && (
        <>
          <Rect x={3} y={5} width={18} height={14} rx={2} {...stroke} />
          <Path d="m4 7 8 6 8-6" {...stroke} />
        </>
      )}
      {name === "back" && <Path d="M15 5 8 12l7 7" {...stroke} />}
      {name === "plus" && <Path d="M12 5v14M5 12h14" {...stroke} />}
      {name === "photo" && (
        <>
          <Rect x={3} y={6} width={18} height={14} rx={2} {...stroke} />
          <Path d="M8.5 6 10 3.5h4L15.5 6" {...stroke} />
          <Circle cx={12} cy={13} r={3.5} {...stroke} />
        </>
      )}
      {name === "check" && <Path d="m5 12.5 4.5 4.5L19 7.5" {...stroke} />}
      {name === "gap" && (
        <>
          <Circle cx={12} cy={12} r={8.5} {...stroke} />
          <Path d="M12 7.5v5.5M12 16.5v.01" {...stroke} />
        </>
      )}
      {name === "device" && (
        <>
          <Rect x={5} y={3.5} width={14} height={11} rx={2} {...stroke} />
          <Path d="M12 14.5V21M9 21h6" {...stroke} />
          <Circle cx={12} cy={9} r={2} {...stroke} />
        </>
      )}
    </Svg>
  );
}
