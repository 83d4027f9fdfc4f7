import { Banner } from "@/components/ui/banner";

/**
 * On the walk, once the scope has gone to the homeowner: what the surveyor captures now is not in
 * the version they are reading or signed, and reaches them only in a new version.
 */
export function ScopeStatusNotice({ status }: { status: string }) {
  if (status === "signed") {
    return (
      <Banner tone="warn" title="The homeowner signed this scope">
        What you change now is not in what they signed. The designer sees it on the plan and publishes a new version for them to sign.
      </Banner>
    );
  }
  if (status === "out_for_sign_off" || status === "changes_asked") {
    return (
      <Banner tone="info" title="The scope is with the homeowner">
        What you change now goes into the next version the designer publishes, not the one they are reading.
      </Banner>
    );
  }
  return null;
}
