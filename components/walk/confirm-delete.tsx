import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmBox } from "@/components/ui/confirm-box";

/** A delete button that asks once more, in place, before anything is removed. */
export function ConfirmDelete({ label, question, onConfirm }: { label: string; question: string; onConfirm: () => Promise<void> }) {
  const [asking, setAsking] = useState(false);
  if (!asking) return <Button tone="secondary" label={label} onPress={() => setAsking(true)} style={{ alignSelf: "flex-start" }} />;
  return <ConfirmBox question={question} confirmLabel={`Yes, ${label.toLowerCase()}`} onConfirm={onConfirm} onClose={() => setAsking(false)} />;
}
