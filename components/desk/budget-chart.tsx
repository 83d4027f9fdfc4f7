// A switch's PoE budget as a picture: what the ports set aside by class, what they are expected to
// draw, the planning ceiling and the budget itself, on one scale.
import { useState } from "react";
import { View, type LayoutChangeEvent } from "react-native";
import Svg, { Line, Rect, Text as SvgText } from "react-native-svg";
import { AppText } from "@/components/ui/text";
import { colors, fonts } from "@/constants/theme";
import type { PlanSwitch } from "@/hooks/queries/plan";
import { formatNumber } from "@/survey/units";

const BAR_H = 18;
const LABEL_W = 118;

export function BudgetChart({ sw }: { sw: PlanSwitch }) {
  const [width, setWidth] = useState(320);
  const onLayout = (e: LayoutChangeEvent) => setWidth(Math.max(200, Math.round(e.nativeEvent.layout.width)));
  const max = Math.max(sw.budgetW, sw.reservedW, sw.expectedW) * 1.08;
  const plotW = width - LABEL_W - 64;
  const x = (w: number) => LABEL_W + (w / max) * plotW;
  const height = 96;
  // Only the basis the site checks is held against the ceiling and the budget; the other bar is shown for reference.
  const state = (value: number, basis: boolean) => (!basis ? "reference" : value > sw.budgetW + 1e-9 ? "over_budget" : value > sw.ceilingW + 1e-9 ? "over_ceiling" : "ok");
  const rows: { label: string; value: number; color: string; y: number; state: string; basis: boolean }[] = [
    { label: "Set aside (class)", value: sw.reservedW, color: colors.slate700, y: 24, state: state(sw.reservedW, sw.basis === "class"), basis: sw.basis === "class" },
    { label: "Expected draw", value: sw.expectedW, color: colors.copper500, y: 52, state: state(sw.expectedW, sw.basis === "expected"), basis: sw.basis === "expected" },
  ];
  // An injector's ports have a fixed power each: it is held against its budget only, with no planning ceiling.
  const hasCeiling = sw.planningCeiling !== null;
  const summary = `${sw.name}: ${formatNumber(sw.reservedW, 1)} W set aside by class, ${formatNumber(sw.expectedW, 1)} W expected, ${hasCeiling ? `planning ceiling ${formatNumber(sw.ceilingW, 1)} W, ` : ""}budget ${formatNumber(sw.budgetW, 1)} W; checked on the ${sw.basis === "class" ? "class reservation" : "expected draw"}.`;
  return (
    <View onLayout={onLayout} role="img" aria-label={summary} testID={`budget-chart-${sw.sourceId}`}>
      <Svg width={width} height={height}>
        <Rect x={LABEL_W} y={16} width={x(sw.budgetW) - LABEL_W} height={62} fill={colors.slate50} />
        {rows.map((r) => (
          <SvgTextRow key={r.label} {...r} x={x} lines={hasCeiling ? [x(sw.ceilingW), x(sw.budgetW)] : [x(sw.budgetW)]} />
        ))}
        {hasCeiling ? <Line x1={x(sw.ceilingW)} x2={x(sw.ceilingW)} y1={14} y2={80} stroke={colors.warn} strokeWidth={2} strokeDasharray="5 4" /> : null}
        <Line x1={x(sw.budgetW)} x2={x(sw.budgetW)} y1={14} y2={88} stroke={colors.ink} strokeWidth={2} />
        {hasCeiling ? (
          <SvgText x={x(sw.ceilingW)} y={10} fontSize={11} fontFamily={fonts.semibold} fill={colors.warn} textAnchor="middle">
            {`ceiling ${formatNumber(sw.ceilingW, 1)} W`}
          </SvgText>
        ) : null}
        <SvgText x={x(sw.budgetW) - 4} y={94} fontSize={11} fontFamily={fonts.semibold} fill={colors.ink} textAnchor="end">
          {`budget ${formatNumber(sw.budgetW, 1)} W`}
        </SvgText>
      </Svg>
      <AppText variant="caption" muted>
        Held against the budget: {sw.basis === "class" ? "what the ports set aside by class (the safe reading)" : "the expected draw (right for a switch that allocates by actual draw)"}. Dashed bar: for reference.{hasCeiling ? "" : " An injector has no planning ceiling: each port's power is fixed."}
      </AppText>
    </View>
  );
}

function SvgTextRow({ label, value, color, y, state, x, basis, lines }: { label: string; value: number; color: string; y: number; state: string; x: (w: number) => number; basis: boolean; lines: number[] }) {
  const end = x(value);
  const figure = `${formatNumber(value, 1)} W`;
  // About 7 px a character at this size: inside the bar only where no ceiling or budget line crosses it.
  const figureW = figure.length * 7 + 6;
  const inside = end - LABEL_W > 64 && !lines.some((l) => l > end - figureW - 2 && l < end + 2);
  const over = state === "over_budget" || state === "over_ceiling";
  const fill = state === "over_budget" ? colors.danger : state === "over_ceiling" ? colors.warn : basis ? color : colors.slate100;
  const stroke = basis ? "none" : colors.slate600;
  return (
    <>
      <SvgText x={0} y={y + 13} fontSize={12} fontFamily={basis ? fonts.bold : fonts.regular} fill={colors.ink}>
        {label}
      </SvgText>
      <Rect x={LABEL_W} y={y} width={Math.max(1, end - LABEL_W)} height={BAR_H} rx={3} fill={fill} stroke={stroke} strokeWidth={1} strokeDasharray={basis ? undefined : "3 2"} />
      {/* The figure sits inside a long bar when no line crosses it there, else just after the bar's end. */}
      <SvgText
        x={inside ? end - 5 : end + 4}
        y={y + 13}
        fontSize={12}
        fontFamily={fonts.bold}
        textAnchor={inside ? "end" : "start"}
        fill={inside ? (basis || over ? colors.onDark : colors.ink) : state === "over_budget" ? colors.danger : over ? colors.warn : colors.ink}
      >
        {figure}
      </SvgText>
    </>
  );
}

/** A run's length against the 90 m link and 100 m channel limits, as a small gauge on the device row. */
export function RunGauge({ lengthM, channelM, units }: { lengthM: number; channelM: number; units: "metric" | "imperial" }) {
  const w = 120;
  const max = Math.max(110, channelM * 1.05);
  const x = (m: number) => (m / max) * w;
  const color = channelM > 100 ? colors.danger : lengthM > 90 ? colors.warn : colors.copper500;
  const ft = (m: number) => (units === "imperial" ? `${formatNumber(m / 0.3048, 0)} ft` : `${formatNumber(m, 1)} m`);
  return (
    <View role="img" aria-label={`Run ${ft(lengthM)}, channel ${ft(channelM)} of the 100 m channel limit`} style={{ flexDirection: "row", alignItems: "center", gap: 6 }}>
      <Svg width={w} height={12}>
        <Rect x={0} y={3} width={w} height={6} rx={3} fill={colors.slate100} />
        <Rect x={0} y={3} width={Math.max(2, x(channelM))} height={6} rx={3} fill={color} />
        <Line x1={x(90)} x2={x(90)} y1={0} y2={12} stroke={colors.warn} strokeWidth={1.5} />
        <Line x1={x(100)} x2={x(100)} y1={0} y2={12} stroke={colors.danger} strokeWidth={1.5} />
      </Svg>
    </View>
  );
}
