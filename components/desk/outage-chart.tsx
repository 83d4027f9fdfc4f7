// "On battery": how long each backed-up device stays up in a power cut, and which go down.
import { useState } from "react";
import { View, type LayoutChangeEvent } from "react-native";
import Svg, { Circle, G, Line, Rect, Text as SvgText } from "react-native-svg";
import { AppText } from "@/components/ui/text";
import { colors, fonts, space } from "@/constants/theme";
import type { Plan } from "@/hooks/queries/plan";
import { formatMinutes } from "@/survey/units";

const ROW = 22;
/** The names' column: wider when the chart is (a desktop shows whole names), about 6.5 px a character at 12 px. */
const labelWidth = (chartW: number) => (chartW >= 640 ? 240 : 150);
const nameChars = (labelW: number) => Math.floor((labelW - 20) / 6.5);

export function OutageChart({ plan }: { plan: Plan }) {
  const [width, setWidth] = useState(320);
  const onLayout = (e: LayoutChangeEvent) => setWidth(Math.max(220, Math.round(e.nativeEvent.layout.width)));
  const names = new Map(plan.devices.map((d) => [d.deviceId, d.name]));
  const up = plan.outage.devices.filter((d) => d.staysUp).sort((a, b) => (b.minutes ?? 0) - (a.minutes ?? 0) || Number(b.mustStayUp) - Number(a.mustStayUp));
  const down = plan.outage.devices.filter((d) => !d.staysUp);
  const criticalDown = down.filter((d) => d.mustStayUp);
  const maxMin = Math.max(60, ...up.map((d) => d.minutes ?? 0));
  // Axis ticks every 15, 30 or 60 minutes.
  const step = maxMin <= 90 ? 15 : maxMin <= 240 ? 30 : 60;
  const axisMax = Math.ceil(maxMin / step) * step;
  const LABEL_W = labelWidth(width);
  const maxChars = nameChars(LABEL_W);
  const plotW = width - LABEL_W - 52;
  const x = (m: number) => LABEL_W + (m / axisMax) * plotW;
  const height = up.length * ROW + 30;
  const ticks: number[] = [];
  for (let t = 0; t <= axisMax; t += step) ticks.push(t);
  const summary = up.length
    ? `${up.length} device${up.length === 1 ? "" : "s"} stay up on battery, the longest about ${formatMinutes(up[0].minutes ?? 0)}; ${down.length} go down${criticalDown.length ? `, ${criticalDown.length} of which must stay up` : ""}.`
    : "No device stays up in a power cut.";
  return (
    <View onLayout={onLayout} style={{ gap: space.sm }}>
      {up.length ? (
        <View role="img" aria-label={summary} testID="outage-chart">
          <Svg width={width} height={height}>
            {ticks.map((t) => (
              <Line key={t} x1={x(t)} x2={x(t)} y1={0} y2={up.length * ROW} stroke={colors.slate100} strokeWidth={1} />
            ))}
            {up.map((d, i) => {
              const y = i * ROW + 4;
              const name = names.get(d.deviceId) ?? d.deviceId;
              return (
                <G key={d.deviceId}>
                  {d.mustStayUp ? <Circle cx={6} cy={y + 7} r={4} fill={colors.copper500} /> : null}
                  <SvgText x={16} y={y + 11} fontSize={12} fontFamily={d.mustStayUp ? fonts.bold : fonts.regular} fill={colors.ink}>
                    {name.length > maxChars ? `${name.slice(0, maxChars - 1)}…` : name}
                  </SvgText>
                  <Rect x={LABEL_W} y={y} width={Math.max(2, x(d.minutes ?? 0) - LABEL_W)} height={14} rx={3} fill={d.minutes === null ? colors.slate100 : colors.slate700} />
                  <SvgText x={x(d.minutes ?? 0) + 4} y={y + 11} fontSize={11} fontFamily={fonts.semibold} fill={colors.ink}>
                    {d.minutes === null ? "unknown" : formatMinutes(d.minutes)}
                  </SvgText>
                </G>
              );
            })}
            {ticks.map((t) => (
              <SvgText key={`l${t}`} x={x(t)} y={up.length * ROW + 16} fontSize={11} fontFamily={fonts.regular} fill={colors.inkMuted} textAnchor="middle">
                {t === 0 ? "0" : formatMinutes(t)}
              </SvgText>
            ))}
          </Svg>
        </View>
      ) : null}
      <AppText variant="caption" muted>
        {summary} A copper dot marks a device that must stay up. Runtimes are estimates: old batteries, heat and heavy loads shorten them.
      </AppText>
      {criticalDown.length ? (
        <AppText variant="caption" style={{ color: colors.danger, fontFamily: fonts.semibold }}>
          Goes down although it must stay up: {criticalDown.map((d) => names.get(d.deviceId) ?? d.deviceId).join(", ")}.
        </AppText>
      ) : null}
    </View>
  );
}
