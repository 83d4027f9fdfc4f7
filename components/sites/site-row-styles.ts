import { StyleSheet } from "react-native";
import { colors, radius, space } from "@/constants/theme";

/** The look of one site in a list (the server's list and the phone's own). */
export const siteRowStyles = StyleSheet.create({
  list: { gap: space.sm },
  row: {
    flexDirection: "row",
    alignItems: "center",
    gap: space.md,
    padding: space.lg,
    backgroundColor: colors.card,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.line,
  },
  rowIcon: { width: 44, height: 44, borderRadius: radius.md, backgroundColor: colors.slate50, alignItems: "center", justifyContent: "center" },
});
