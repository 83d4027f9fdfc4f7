// Keyboard handling that React Native's props do not type: on the web a Pressable passes
// `onKeyDown` through to its element. `webKeyDown` gives the prop to spread.
export type WebKeyEvent = { key?: string; nativeEvent?: { key?: string }; preventDefault?: () => void };

/** The key pressed ("" when unknown); Space reads " " whatever the browser calls it. */
export function keyOf(e: WebKeyEvent): string {
  const key = e.key ?? e.nativeEvent?.key ?? "";
  return key === "Spacebar" ? " " : key;
}

/** `{...webKeyDown(handler)}` on a Pressable. */
export function webKeyDown(handler: (e: WebKeyEvent) => void): object {
  return { onKeyDown: handler };
}
