import { formatNumber } from '../units';
import { POE_TYPES } from '../standards/poe-types';
import type { DeviceEvaluation, OutletPlan, PoePlan, Recommendation, SplitterPlan } from './result-types';

/** Our fixed wording for each recommendation. */
export const RECOMMENDATION_WORDS: Readonly<Record<Recommendation, string>> = {
  poe: 'PoE',
  poe_splitter: 'PoE + splitter',
  existing_outlet: 'existing outlet',
  new_outlet: 'new outlet (electrician)',
  cannot_power: "can't power here",
};

type LabelInput = Pick<DeviceEvaluation, 'recommendation'> & {
  readonly poe: Pick<PoePlan, 'poeClass' | 'poeType'> | null;
  readonly splitter: Pick<SplitterPlan, 'outputVolts' | 'ratingAmps' | 'plug'> | null;
  /** How an outlet-fed device is fed: a doorbell on its transformer is labelled by the transformer. */
  readonly outlet?: Pick<OutletPlan, 'via'> | null;
};

/**
 * "PoE (Class 4, 802.3at port)", "PoE + splitter (12 V · 1.5 A · 5.5×2.1 mm centre-positive)",
 * "existing outlet", "new outlet (electrician)", "can't power here"; a device on a low-voltage
 * transformer (a wired doorbell): "existing transformer", "new transformer (electrician)".
 */
export function recommendationLabel(result: LabelInput): string {
  switch (result.recommendation) {
    case 'poe':
      if (result.poe) return `PoE (Class ${result.poe.poeClass}, ${POE_TYPES[result.poe.poeType].standardName} port)`;
      return RECOMMENDATION_WORDS.poe;
    case 'poe_splitter':
      if (result.splitter) {
        const s = result.splitter;
        return `PoE + splitter (${formatNumber(s.outputVolts)} V · ${formatNumber(s.ratingAmps)} A · ${s.plug.label})`;
      }
      return RECOMMENDATION_WORDS.poe_splitter;
    case 'existing_outlet':
      return result.outlet?.via === 'transformer' ? 'existing transformer' : RECOMMENDATION_WORDS.existing_outlet;
    case 'new_outlet':
      return result.outlet?.via === 'transformer' ? 'new transformer (electrician)' : RECOMMENDATION_WORDS.new_outlet;
    default:
      return RECOMMENDATION_WORDS[result.recommendation];
  }
}
