// Tells the designer when the plan no longer matches the last scope the homeowner was sent or signed.
import { Banner } from "@/components/ui/banner";
import { money, when } from "@/components/ui/format";
import type { Plan } from "@/hooks/queries/plan";
import { scopeDriftWords } from "@/survey/report";

export function ScopeDriftNotice({ scope }: { scope: Plan["scope"] }) {
  if (!scope?.changed) return null;
  const what = scopeDriftWords(scope, money);
  const next = scope.sinceVersion + 1;
  if (scope.signed) {
    return (
      <Banner tone="warn" title={`Changed since the homeowner signed version ${scope.sinceVersion}`}>
        {`${what} Their signature (${when(scope.signedAt)}) covers version ${scope.sinceVersion} only: publish version ${next} on the Report tab for them to sign the plan as it is now.`}
      </Banner>
    );
  }
  return (
    <Banner tone="info" title={`Changed since version ${scope.sinceVersion} was published`}>
      {`${what} The homeowner is reading version ${scope.sinceVersion}: publish version ${next} on the Report tab so they see the plan as it is now.`}
    </Banner>
  );
}
