import { useWindowDimensions } from "react-native";
import { WIDE_BREAKPOINT } from "@/constants/theme";

/** The one place that decides phone layout versus wide layout. */
export function useBreakpoint() {
  const { width } = useWindowDimensions();
  const wide = width >= WIDE_BREAKPOINT;
  return { wide, width };
}
