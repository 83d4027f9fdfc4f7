// Dropwise's look: deep slate green for structure, copper for the cable that runs through it,
// on a warm paper background. Contrast is chosen for a dim basement and a bright driveway (WCAG AA+).
export const colors = {
  slate900: "#12261F",
  slate800: "#1F3A34",
  slate700: "#2C4F46",
  slate600: "#3D655A",
  slate100: "#DDE7E2",
  slate50: "#EEF3F0",
  copper700: "#8A4B1C",
  copper600: "#A65D26",
  copper500: "#C47A3C",
  copper100: "#F5E3D3",
  paper: "#F7F4EE",
  card: "#FFFFFF",
  ink: "#17211D",
  inkMuted: "#4A5853",
  line: "#D5DCD8",
  good: "#1E6B45",
  goodBg: "#E1F2E8",
  warn: "#8A5A00",
  warnBg: "#FBEFD3",
  danger: "#A12C2C",
  dangerBg: "#F8E1E1",
  onDark: "#F7F4EE",
  onDarkMuted: "#B9CBC4",
} as const;

export const fonts = {
  regular: "NunitoSans_400Regular",
  semibold: "NunitoSans_600SemiBold",
  bold: "NunitoSans_700Bold",
  heavy: "NunitoSans_800ExtraBold",
} as const;

export const space = { xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32 } as const;
export const radius = { sm: 6, md: 10, lg: 16, pill: 999 } as const;

/** Touch targets stay at least this tall (gloved hands on a ladder). */
export const minTouch = 48;

/** At this width and above the shell switches from bottom navigation to a side rail. */
export const WIDE_BREAKPOINT = 1024;
export const CONTENT_MAX_WIDTH = 1120;
export const SIDE_NAV_WIDTH = 232;
