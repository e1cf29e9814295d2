/**
 * Proposed fuelling targets per hour (carbohydrate, fluid, sodium) by expected duration, the sweat-rate
 * estimate, the 2 % body-mass threshold, and the unit conversions the fuel planner needs.
 *
 * Every published number names its source beside it. The sources and how sure we are of each figure are
 * those of the project's reference sheet (REFERENCES.md §7): "confirmed" means the sheet saw the
 * figure in a search excerpt, "secondary" that only a restatement was seen, "from memory" that the figure was
 * not seen at all and must be checked against the original before anyone relies on it.
 */

/** How sure we are of a figure (see the file comment). `computed` is arithmetic on other figures; `set` is the user's own. */
export type Evidence = 'confirmed' | 'secondary' | 'from memory' | 'common practice' | 'computed' | 'set';

/** A target per hour: a range with its unit, the source it comes from and a sentence for people. */
export interface FuelTarget {
  low: number;
  /** Null when the source gives no upper figure ("small amounts"): nothing counts as over. */
  high: number | null;
  unit: 'g/h' | 'ml/h' | 'mg/h';
  source: string;
  note: string;
  evidence: Evidence;
}

export interface FuelTargets {
  carbohydrate: FuelTarget;
  fluid: FuelTarget;
  sodium: FuelTarget;
}

// ─── Units ──────────────────────────────────────────────────────────────────────────────────

/** Sodium molar mass, g/mol (IUPAC standard atomic weight 22.989 769 28; REFERENCES.md §7). */
export const NA_G_PER_MOL = 22.98976928;
/** Chlorine standard atomic weight 35.453 g/mol (IUPAC; REFERENCES.md §7); NaCl = Na + Cl. */
export const NACL_G_PER_MOL = NA_G_PER_MOL + 35.453;
/** US fluid ounce, mL, exact: 1/128 of the 231 in³ US gallon (NIST Handbook 44, Appendix C; REFERENCES.md §1). */
export const ML_PER_US_FL_OZ = 29.5735295625;
/** Avoirdupois pound, kg, exact (1959 international yard and pound agreement; REFERENCES.md §1). */
export const KG_PER_LB = 0.45359237;

function assertFinite(value: number, name: string, { min = -Infinity, positive = false } = {}): void {
  if (!Number.isFinite(value)) throw new RangeError(`${name} must be a finite number.`);
  if (positive && value <= 0) throw new RangeError(`${name} must be more than 0.`);
  if (value < min) throw new RangeError(`${name} must be at least ${min}.`);
}

/** Sodium concentration: mmol/L → mg/L of sodium (× 22.98976928). 35 mmol/L → 804.64 mg/L. */
export function sodiumMgPerLFromMmol(mmolPerL: number): number {
  assertFinite(mmolPerL, 'A sodium concentration', { min: 0 });
  return mmolPerL * NA_G_PER_MOL;
}

/** Sodium concentration: mg/L of sodium → mmol/L. 500 mg/L → 21.7 mmol/L. */
export function sodiumMmolFromMgPerL(mgPerL: number): number {
  assertFinite(mgPerL, 'A sodium concentration', { min: 0 });
  return mgPerL / NA_G_PER_MOL;
}

/** Sodium concentration mmol/L → the same sodium as table salt, g/L of NaCl. 35 mmol/L → 2.0455 g/L. */
export function saltGPerLFromSodiumMmol(mmolPerL: number): number {
  assertFinite(mmolPerL, 'A sodium concentration', { min: 0 });
  return (mmolPerL * NACL_G_PER_MOL) / 1000;
}

/** Milligrams of sodium in `grams` of table salt (NaCl): 1 g → 393.4 mg. */
export function sodiumMgInSalt(grams: number): number {
  assertFinite(grams, 'An amount of salt', { min: 0 });
  return (grams * 1000 * NA_G_PER_MOL) / NACL_G_PER_MOL;
}

/** Millilitres → US fluid ounces (NIST: 29.5735295625 mL each). 250 mL → 8.4535 fl oz. */
export function mlToUsFlOz(ml: number): number {
  assertFinite(ml, 'A volume', { min: 0 });
  return ml / ML_PER_US_FL_OZ;
}

/** US fluid ounces → millilitres. Note that US food labels round 1 fl oz to 30 mL (21 CFR 101.9); we do not. */
export function usFlOzToMl(flOz: number): number {
  assertFinite(flOz, 'A volume', { min: 0 });
  return flOz * ML_PER_US_FL_OZ;
}

/** Carbohydrate in a drink: `percent` % is `percent` × 10 g per litre, so a 6 % drink carries 30 g in 500 mL. */
export function carbohydrateInDrinkG(percent: number, ml: number): number {
  assertFinite(percent, 'A concentration', { min: 0 });
  assertFinite(ml, 'A volume', { min: 0 });
  return (percent * 10 * ml) / 1000;
}

// ─── Sweat rate and body mass ──────────────────────────────────────────────────────────────

/**
 * The threshold Sawka et al. (2007) set for excessive dehydration: losing more than 2 % of body mass
 * (ACSM position stand, Med Sci Sports Exerc 39(2): 377–390; confirmed, journal summary).
 */
export const DEHYDRATION_THRESHOLD_PCT = 2;

/** `pct` % of a body mass, in kg and lb. 2 % of 70 kg = 1.40 kg (3.086 lb). */
export function bodyMassShare(bodyMassKg: number, pct = DEHYDRATION_THRESHOLD_PCT): { kg: number; lb: number } {
  assertFinite(bodyMassKg, 'Body mass', { positive: true });
  assertFinite(pct, 'A percentage', { min: 0 });
  const kg = (bodyMassKg * pct) / 100;
  return { kg, lb: kg / KG_PER_LB };
}

export interface SweatTest {
  pre_kg: number;
  post_kg: number;
  /** Fluid drunk during the run, litres. */
  drank_l: number;
  /** Urine passed during the run, litres (usually 0). */
  urine_l?: number;
  duration_s: number;
}

export interface SweatRate {
  /** Litres per hour, taking 1 kg of body mass as 1 L of sweat. */
  l_per_h: number;
  /** Body-mass change, % of the pre-run mass (negative = lost). */
  body_mass_change_pct: number;
  /** True when the loss exceeded the 2 % threshold (Sawka et al. 2007). */
  over_threshold: boolean;
}

/**
 * Sweat rate from body mass before and after a run (the mass-balance method the ACSM position stand
 * describes; Sawka et al. 2007, confirmed): (pre − post + drunk − urine) / hours, assuming 1 kg = 1 L.
 * Worked (REFERENCES.md §7): 70 → 68.9 kg, 0.5 L drunk, 1.5 h → 1.0667 L/h; body-mass change −1.571 %.
 */
export function sweatRate(test: SweatTest): SweatRate {
  assertFinite(test.pre_kg, 'Body mass before', { positive: true });
  assertFinite(test.post_kg, 'Body mass after', { positive: true });
  assertFinite(test.drank_l, 'Fluid drunk', { min: 0 });
  assertFinite(test.urine_l ?? 0, 'Urine', { min: 0 });
  assertFinite(test.duration_s, 'Duration', { positive: true });
  const hours = test.duration_s / 3600;
  const litres = test.pre_kg - test.post_kg + test.drank_l - (test.urine_l ?? 0);
  if (litres < 0) throw new RangeError('These numbers give a negative sweat loss: check the weights and the fluid drunk.');
  const change = ((test.post_kg - test.pre_kg) / test.pre_kg) * 100;
  return { l_per_h: litres / hours, body_mass_change_pct: change, over_threshold: -change > DEHYDRATION_THRESHOLD_PCT };
}

/** Average sweat sodium, mmol/L (ACSM 2007 citing the Institute of Medicine: about 35 mEq/L; secondary restatement). */
export const SWEAT_SODIUM_MMOL_PER_L = 35;

/** Sodium lost in sweat, mg per hour: sweat rate × sweat sodium × 22.99. 0.5 / 1.0 / 1.5 L/h at 35 mmol/L → 402 / 805 / 1207. */
export function sweatSodiumLossMgPerH(sweatLPerH: number, sweatSodiumMmolPerL = SWEAT_SODIUM_MMOL_PER_L): number {
  assertFinite(sweatLPerH, 'Sweat rate', { min: 0 });
  return sweatLPerH * sodiumMgPerLFromMmol(sweatSodiumMmolPerL);
}

// ─── Carbohydrate ──────────────────────────────────────────────────────────────────────────

/** One published duration band of carbohydrate advice during exercise. */
export interface CarbohydrateBand {
  /** Expected duration this band covers, seconds: from ≤ d < to (to null: open ended). */
  from_s: number;
  to_s: number | null;
  /** As published, in words. */
  advice: string;
  low: number;
  high: number | null;
  source: string;
  evidence: Evidence;
}

const MIN = 60;
const HOUR = 3600;

const JEUKENDRUP = 'Jeukendrup 2014, Sports Med 44(Suppl 1): S25–S33';
const JOINT_2016 = 'Thomas, Erdman & Burke 2016, ACSM / Academy of Nutrition and Dietetics / Dietitians of Canada joint position';

/**
 * Jeukendrup (2014) by expected duration. The abstract (confirmed) gives: about 1 h mouth rinse or small amounts;
 * 2–3 h about 60 g/h; ultra-endurance about 90 g/h from multiple transportable carbohydrates; the ≥ 2.5 h → 90 g/h
 * threshold is confirmed by the author's GSSI Sports Science Exchange #108. The finer bands of the paper's figure
 * (< 30 min none; 30–75 min mouth rinse; 1–2 h up to 30 g/h) are from memory; a restatement confirms the first two.
 * Where the figure's bands overlap (60–75 min, 2–3 h vs > 2.5 h) the longer band wins from its start.
 */
export const JEUKENDRUP_2014_BANDS: readonly CarbohydrateBand[] = [
  { from_s: 0, to_s: 30 * MIN, advice: 'not needed', low: 0, high: 0, source: `${JEUKENDRUP} (figure)`, evidence: 'secondary' },
  {
    from_s: 30 * MIN,
    to_s: 75 * MIN,
    advice: 'mouth rinse or small amounts',
    low: 0,
    high: null,
    source: `${JEUKENDRUP} (abstract and figure)`,
    evidence: 'confirmed',
  },
  {
    from_s: 75 * MIN,
    to_s: 2 * HOUR,
    advice: 'up to 30 g/h',
    low: 0,
    high: 30,
    source: `${JEUKENDRUP} (figure)`,
    evidence: 'from memory',
  },
  {
    from_s: 2 * HOUR,
    to_s: 2.5 * HOUR,
    advice: 'about 60 g/h',
    low: 0,
    high: 60,
    source: `${JEUKENDRUP} (abstract)`,
    evidence: 'confirmed',
  },
  {
    from_s: 2.5 * HOUR,
    to_s: null,
    advice: 'up to 90 g/h, only from multiple transportable carbohydrates (glucose and fructose)',
    low: 0,
    high: 90,
    source: `${JEUKENDRUP} (abstract); Jeukendrup, GSSI Sports Science Exchange #108`,
    evidence: 'confirmed',
  },
];

/**
 * The 2016 joint position's table for carbohydrate during exercise (Thomas et al. 2016, Med Sci Sports Exerc 48(3):
 * 543–568; volume and pages from memory). The table rows are from memory, consistent with a third-party handout
 * of that table: < 45 min not needed; 45–75 min small amounts or mouth rinse; 1–2.5 h 30–60 g/h; > 2.5–3 h up to
 * 90 g/h. Its 1 h and 75 min rows overlap; we start the 30–60 g/h band at 75 min.
 */
export const JOINT_POSITION_2016_BANDS: readonly CarbohydrateBand[] = [
  { from_s: 0, to_s: 45 * MIN, advice: 'not needed', low: 0, high: 0, source: JOINT_2016, evidence: 'from memory' },
  {
    from_s: 45 * MIN,
    to_s: 75 * MIN,
    advice: 'small amounts or mouth rinse',
    low: 0,
    high: null,
    source: JOINT_2016,
    evidence: 'from memory',
  },
  { from_s: 75 * MIN, to_s: 2.5 * HOUR, advice: '30–60 g/h', low: 30, high: 60, source: JOINT_2016, evidence: 'from memory' },
  { from_s: 2.5 * HOUR, to_s: null, advice: 'up to 90 g/h', low: 0, high: 90, source: JOINT_2016, evidence: 'from memory' },
];

/** The band of `bands` an expected duration (seconds, > 0) falls in. */
export function carbohydrateBand(bands: readonly CarbohydrateBand[], durationS: number): CarbohydrateBand {
  assertFinite(durationS, 'Expected duration', { positive: true });
  return bands.find((b) => durationS >= b.from_s && (b.to_s === null || durationS < b.to_s)) ?? bands[bands.length - 1]!;
}

/**
 * The carbohydrate target Pacewright proposes for an expected duration, in g per hour:
 * - under 45 min: none (joint position 2016; Jeukendrup's figure says none under 30 min);
 * - 45–75 min: mouth rinse or small amounts, no figure (both sources);
 * - 75 min–2.5 h: 30–60 g/h (joint position 2016, from memory; Jeukendrup's figure, from memory, says up to 30 g/h for 1–2 h);
 * - over 2.5 h: 60–90 g/h: the upper figure is Jeukendrup's (confirmed), only from multiple transportable carbohydrates;
 *   the lower is his "about 60 g/h", the oxidation limit of a single carbohydrate (abstract, confirmed).
 * Worked (REFERENCES.md §7): a 3:30:00 marathon at 60–90 g/h is 210–315 g.
 */
export function proposeCarbohydrateTarget(durationS: number): FuelTarget {
  const joint = carbohydrateBand(JOINT_POSITION_2016_BANDS, durationS);
  const jeuk = carbohydrateBand(JEUKENDRUP_2014_BANDS, durationS);
  const both = `Joint position 2016: ${joint.advice} (table wording from memory). Jeukendrup 2014: ${jeuk.advice}${
    jeuk.evidence === 'from memory' ? ' (figure band from memory)' : ''
  }.`;
  if (durationS >= 2.5 * HOUR) {
    return {
      low: 60,
      high: 90,
      unit: 'g/h',
      source: `${JEUKENDRUP}; ${JOINT_2016}`,
      note: `${both} About 60 g/h is what one kind of carbohydrate can supply; up to 90 g/h only from a glucose and fructose mix. The advice does not depend on body mass. Practise it on long runs first.`,
      evidence: 'confirmed',
    };
  }
  if (durationS >= 75 * MIN) {
    return {
      low: 30,
      high: 60,
      unit: 'g/h',
      source: JOINT_2016,
      note: `${both} Practise it on long runs first.`,
      evidence: 'from memory',
    };
  }
  if (durationS >= 45 * MIN) {
    return {
      low: 0,
      high: null,
      unit: 'g/h',
      source: `${JEUKENDRUP}; ${JOINT_2016}`,
      note: `${both} No figure is given: a mouth rinse or a little carbohydrate.`,
      evidence: 'confirmed',
    };
  }
  return {
    low: 0,
    high: 0,
    unit: 'g/h',
    source: `${JOINT_2016}; ${JEUKENDRUP}`,
    note: `${both} A run this short needs no carbohydrate during it.`,
    evidence: 'secondary',
  };
}

// ─── Fluid ─────────────────────────────────────────────────────────────────────────────────

const SAWKA_2007 = 'Sawka et al. 2007, ACSM position stand: Exercise and fluid replacement, Med Sci Sports Exerc 39(2): 377–390';
const HEW_BUTLER_2015 =
  'Hew-Butler et al. 2015, Third International Exercise-Associated Hyponatremia Consensus, Clin J Sport Med 25(4): 303–320';

/** Starting range for marathon running, L/h (Sawka et al. 2007; the figure is confirmed only by secondary sources). */
export const FLUID_START_RANGE_L_PER_H = { low: 0.4, high: 0.8 } as const;

/**
 * The fluid target, mL per hour. Without a sweat test: the 0.4–0.8 L/h starting range (Sawka et al. 2007, seen only in
 * secondary sources). With a sweat rate and body mass: computed so the run loses at most 2 % of body mass (low) and
 * never replaces more than the sweat (high), as Sawka et al. 2007 put it — and never more than thirst asks for
 * (Hew-Butler et al. 2015).
 */
export function proposeFluidTarget(durationS: number, sweat?: { sweat_l_per_h: number; body_mass_kg: number }): FuelTarget {
  assertFinite(durationS, 'Expected duration', { positive: true });
  const caution = 'Drink to thirst and never so much that you gain weight during the run (hyponatraemia).';
  if (sweat) {
    assertFinite(sweat.sweat_l_per_h, 'Sweat rate', { min: 0 });
    const hours = durationS / HOUR;
    const allowedLossL = bodyMassShare(sweat.body_mass_kg).kg;
    const lowL = Math.max(0, sweat.sweat_l_per_h - allowedLossL / hours);
    return {
      low: lowL * 1000,
      high: sweat.sweat_l_per_h * 1000,
      unit: 'ml/h',
      source: `${SAWKA_2007}; ${HEW_BUTLER_2015}`,
      note: `Computed from your sweat rate (${sweat.sweat_l_per_h.toFixed(2)} L/h): enough to keep the loss under 2 % of body mass, never more than you sweat. ${caution}`,
      evidence: 'computed',
    };
  }
  return {
    low: FLUID_START_RANGE_L_PER_H.low * 1000,
    high: FLUID_START_RANGE_L_PER_H.high * 1000,
    unit: 'ml/h',
    source: `${SAWKA_2007} (0.4–0.8 L/h seen only in secondary sources); ${HEW_BUTLER_2015}`,
    note: `A starting range for marathon running: more for faster, heavier runners in warm weather, less for slower, lighter runners in cool weather. A sweat test (weigh before and after) narrows it. ${caution}`,
    evidence: 'secondary',
  };
}

// ─── Sodium ────────────────────────────────────────────────────────────────────────────────

/** Sodium in sports drinks for exercise over 1.5 h, mg/L (German Nutrition Society (DGE) working group, 2020; confirmed). */
export const DGE_2020_DRINK_SODIUM_MG_PER_L = { low: 400, high: 1100 } as const;
const DGE_2020 = 'German Nutrition Society (DGE) working group position, 2020, Dtsch Z Sportmed';
const ACSM_2007_SODIUM =
  'Sawka et al. 2007 citing the Institute of Medicine (sweat sodium about 35 mmol/L; secondary restatement)';

/**
 * The sodium target, mg per hour. No authoritative mg-per-hour figure is published, so it is computed: the fluid
 * target × the sodium concentration the DGE (2020) gives for sports drinks, 400–1100 mg/L (the lower end only for
 * runs over 1.5 h, which that figure is for). With a sweat rate, the note adds the estimated sweat loss at 35 mmol/L.
 */
export function proposeSodiumTarget(durationS: number, fluid: FuelTarget, sweatLPerH?: number): FuelTarget {
  assertFinite(durationS, 'Expected duration', { positive: true });
  const long = durationS > 1.5 * HOUR;
  const loss =
    sweatLPerH === undefined
      ? ''
      : ` At ${sweatLPerH.toFixed(2)} L/h of sweat and an average 35 mmol/L you lose about ${Math.round(sweatSodiumLossMgPerH(sweatLPerH))} mg/h; sweat sodium varies a lot between people.`;
  return {
    low: long ? (fluid.low / 1000) * DGE_2020_DRINK_SODIUM_MG_PER_L.low : 0,
    high: ((fluid.high ?? fluid.low) / 1000) * DGE_2020_DRINK_SODIUM_MG_PER_L.high,
    unit: 'mg/h',
    source: `${DGE_2020}; ${ACSM_2007_SODIUM}`,
    note: `Computed: your fluid range × 400–1100 mg of sodium per litre, the DGE 2020 figure for sports drinks in exercise over 1.5 h. No single published mg-per-hour figure exists.${loss}`,
    evidence: 'computed',
  };
}

export interface TargetInput {
  duration_s: number;
  body_mass_kg?: number | undefined;
  /** From a sweat test (see `sweatRate`), L/h. */
  sweat_l_per_h?: number | undefined;
}

/** The three targets per hour Pacewright proposes for a run of `duration_s` seconds (see each function above). */
export function proposeTargets(input: TargetInput): FuelTargets {
  const sweat =
    input.sweat_l_per_h !== undefined && input.body_mass_kg !== undefined
      ? { sweat_l_per_h: input.sweat_l_per_h, body_mass_kg: input.body_mass_kg }
      : undefined;
  const fluid = proposeFluidTarget(input.duration_s, sweat);
  return {
    carbohydrate: proposeCarbohydrateTarget(input.duration_s),
    fluid,
    sodium: proposeSodiumTarget(input.duration_s, fluid, input.sweat_l_per_h),
  };
}

/**
 * Servings needed to reach `perHour` over `durationS`: 60 g/h over 2 h 30 min from 25 g gels is 6.
 * Rounded up; 0 when the target is 0.
 */
export function servingsNeeded(perHour: number, durationS: number, perServing: number): number {
  assertFinite(perHour, 'A target', { min: 0 });
  assertFinite(durationS, 'Duration', { positive: true });
  assertFinite(perServing, 'A serving', { positive: true });
  return Math.ceil(Number(((perHour * durationS) / HOUR / perServing).toFixed(9)));
}
