// After a save that held fields back, the keyboard goes to the first field marked wrong, so the
// surveyor fixes it at once instead of hunting for it (web; on a native build this does nothing).
export function focusFirstInvalid(): void {
  if (typeof document === "undefined" || typeof requestAnimationFrame === "undefined") return;
  // The marks are drawn on the next frame, after the messages are set.
  requestAnimationFrame(() => {
    const marked = document.querySelector<HTMLElement>('[aria-invalid="true"]');
    if (!marked) return;
    const target = marked.matches("input, textarea, [tabindex]") ? marked : marked.querySelector<HTMLElement>("input, textarea, [role=radio], [tabindex]");
    (target ?? marked).scrollIntoView?.({ block: "center" });
    target?.focus();
  });
}
