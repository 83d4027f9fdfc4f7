// A pressable that is a checkbox: announced as one, ticked by a press, Enter or Space (the key a
// keyboard user reaches for first; the web's own Pressable only answers Enter for a checkbox).
import type { ReactNode } from "react";
import { Pressable, type StyleProp, type ViewStyle } from "react-native";
import { keyOf, webKeyDown } from "./web-keys";

export function CheckPress({ checked, label, onToggle, style, children }: { checked: boolean; label: string; onToggle: () => void; style?: StyleProp<ViewStyle>; children: ReactNode }) {
  return (
    <Pressable
      role="checkbox"
      aria-checked={checked}
      aria-label={label}
      onPress={onToggle}
      // Web only: Space ticks a checkbox. preventDefault keeps the page from scrolling as well.
      {...webKeyDown((e) => {
        if (keyOf(e) !== " ") return;
        e.preventDefault?.();
        onToggle();
      })}
      style={style}
    >
      {children}
    </Pressable>
  );
}
