// `npm run bench`: every benchmark, printed as figures and ratios measured in this same run.
// It reports; it never fails because the machine is slow.
import { runRulesBench } from "./rules-bench";
import { runApiBench } from "./api-bench";
import { runSyncBench } from "./sync-bench";
import { runWebBench } from "./web-bench";

type Bench = () => Promise<{ name: string; figures: Record<string, number | string> }>;

const BENCHES: Bench[] = [runRulesBench, runSyncBench, runApiBench, runWebBench];

async function main() {
  for (const bench of BENCHES) {
    try {
      const { name, figures } = await bench();
      console.log(`\n${name}`);
      for (const [k, v] of Object.entries(figures)) console.log(`  ${k}: ${v}`);
    } catch (err) {
      console.log(`\n${bench.name}: could not run (${err instanceof Error ? err.message : String(err)})`);
    }
  }
}

void main();
