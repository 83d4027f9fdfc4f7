// Words and tones the desk uses for a plan's recommendations, warnings and devices.
import { colors } from "@/constants/theme";
import type { Recommendation, Severity } from "@/survey/rules/result-types";

export const RECOMMENDATION_TONE: Record<Recommendation, "neutral" | "copper" | "good" | "warn" | "danger"> = {
  poe: "good",
  poe_splitter: "copper",
  existing_outlet: "neutral",
  new_outlet: "warn",
  cannot_power: "danger",
};

export const SEVERITY_COLOR: Record<Severity, { fg: string; bg: string; word: string }> = {
  info: { fg: colors.slate700, bg: colors.slate50, word: "Note" },
  warning: { fg: colors.warn, bg: colors.warnBg, word: "Check" },
  error: { fg: colors.danger, bg: colors.dangerBg, word: "Problem" },
};

export const KIND_WORDS: Record<string, string> = {
  access_point: "access point",
  camera: "camera",
  doorbell: "doorbell",
  hub: "hub",
  small_computer: "small computer",
  compact_switch: "compact switch",
  other: "device",
};

/** Warnings about how long a cable run is: shown on the device row itself. */
export const RUN_LENGTH_CODES = new Set(["link_over_90m", "channel_over_100m", "cable_cannot_carry", "passive_voltage_drop", "decision_poe_fails"]);
