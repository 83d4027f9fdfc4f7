/**
 * Cautions shown with results. Each has a stable id, homeowner-readable text
 * and a source tag. The site-wide list follows facts §7 ("Cautions the tool
 * should show", [PRACTICE], each backed by the rows cited).
 */
export type CautionId =
  | 'local_code'
  | 'mains_electrician'
  | 'cable_rating'
  | 'no_cca'
  | 'mains_separation'
  | 'bundling'
  | 'passive_poe'
  | 'barrel_plug'
  | 'outdoor_runs'
  | 'battery'
  | 'doorbell_transformer';

export interface Caution {
  readonly id: CautionId;
  readonly text: string;
  /** Provenance tag, e.g. "[PRACTICE] facts §7; [CONFIRMED] S83, S85". */
  readonly source: string;
}

function caution(id: CautionId, text: string, source: string): Caution {
  return Object.freeze({ id, text, source });
}

export const CAUTIONS: Readonly<Record<CautionId, Caution>> = {
  local_code: caution('local_code',
    'Local code and the local inspector (the authority having jurisdiction) have the final say. Electrical code editions differ from place to place (2017, 2020, 2023).',
    '[PRACTICE] facts §7 (1); code editions [CONFIRMED] S71, S72, S73'),
  mains_electrician: caution('mains_electrician',
    'Any mains work — a new outlet, a doorbell transformer (its primary side is 120/240 V), a hard-wired battery backup — must be done by a licensed electrician.',
    '[PRACTICE] facts §7 (2)'),
  cable_rating: caution('cable_rating',
    'Use listed, solid-copper cable with the right fire rating: riser-rated (CMR) between floors, plenum-rated (CMP) in air-handling spaces; general-purpose (CM) is usually enough inside the walls of a home.',
    '[CONFIRMED] S79v, S80v, S81v, S82v; facts §7 (3)'),
  no_cca: caution('no_cca',
    'Never use copper-clad aluminium (CCA) cable: it is not allowed for communications cable, has about 1.5 times the resistance of copper, heats up under PoE and breaks easily.',
    '[CONFIRMED] S29, S30v, S31v; 1.54 × copper [DERIVED] S20'),
  mains_separation: caution('mains_separation',
    'Network cable must not share a box or conduit with mains wiring unless a listed barrier separates them; keep at least 50 mm (2 in) apart on open runs.',
    '[CONFIRMED] S83, S84, S85, S86, S87'),
  bundling: caution('bundling',
    'High-power PoE cables (802.3bt) warm up when bundled: keep bundles loose and at most 24 cables, use Cat 6A for new builds, and check the code table for bundles above 60 W per cable (NEC 725.144).',
    '[CONFIRMED] S21, S23v (TSB-184-A); S26v, S27v (NEC 725.144 > 60 W)'),
  passive_poe: caution('passive_poe',
    'Passive PoE keeps its voltage on the cable all the time, with no safety check. Never connect a passive injector to ordinary or unknown network gear, and use only the injector voltage the device is made for — the wrong one destroys it.',
    '[CONFIRMED] S61, S62, S63v'),
  barrel_plug: caution('barrel_plug',
    'Check the barrel plug before connecting: the polarity symbol (centre-positive is common but not universal) and the inner diameter — 2.1 mm and 2.5 mm plugs look alike but do not connect reliably.',
    '[CONFIRMED] S45v, S46v, S47, S48v, S51'),
  outdoor_runs: caution('outdoor_runs',
    'Outdoor cable runs need outdoor (UV / burial) rated cable, surge protection and bonding where the cable enters the house; lightning can damage PoE ports.',
    '[CONFIRMED] S6 (lightning); protector and bonding clauses [MEMORY]; facts §7 (8)'),
  battery: caution('battery',
    'Battery backup runtimes are estimates: old batteries, heat and heavy loads shorten them. Place and ventilate the battery unit as its instructions say and replace ageing batteries.',
    '[CONFIRMED] S33, S34, S35 (derating), S36 (high-rate losses); placement [PRACTICE]'),
  doorbell_transformer: caution('doorbell_transformer',
    'A wired doorbell needs a transformer of at least 16 V and 30 VA; older ones are often only about 10 VA. Replacing the transformer is mains work for a licensed electrician.',
    '[CONFIRMED] S66, S67'),
};

/** The site-wide list of facts §7, in the order of that list. */
export const SITE_CAUTION_IDS: readonly CautionId[] = [
  'local_code', 'mains_electrician', 'cable_rating', 'no_cca', 'mains_separation',
  'bundling', 'passive_poe', 'barrel_plug', 'outdoor_runs',
];
