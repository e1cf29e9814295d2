/**
 * The standard caution texts shown wherever fluid, sodium, carbohydrate, caffeine or cold-water numbers appear
 * (product.md, "Safety"). Each names its source (REFERENCES.md §7 and §9) and ends with who has the last word.
 */

export const CAUTION_TOPICS = ['fluid', 'sodium', 'carbohydrate', 'caffeine', 'cold water'] as const;
export type CautionTopic = (typeof CAUTION_TOPICS)[number];

export interface Caution {
  topic: CautionTopic;
  title: string;
  text: string;
  source: string;
  last_word: string;
}

/** Said with every caution (product.md, "Safety"). */
export const LAST_WORD = 'A physician, a registered dietitian or a qualified coach has the last word for you as an individual.';

/** Machado et al. 2016 pooled trials: 10–15 °C for 10–15 min gave the best results (REFERENCES.md §9, confirmed). */
export const COLD_WATER_STUDIED = { temp_c: { low: 10, high: 15 }, minutes: { low: 10, high: 15 } } as const;

export const CAUTIONS: Readonly<Record<CautionTopic, Caution>> = {
  fluid: {
    topic: 'fluid',
    title: 'Drink to thirst, not beyond it',
    text:
      'Drinking more than you sweat can dilute the sodium in your blood (exercise-associated hyponatraemia), which can be ' +
      'dangerous. Let thirst guide you, never drink so much that you weigh more after the run than before, and treat the ' +
      'fluid range as a starting point, not a quota. Losing more than 2 % of body mass is the other limit to respect.',
    source:
      'Hew-Butler et al. 2015, Third International Exercise-Associated Hyponatremia Consensus, Clin J Sport Med 25(4): 303–320; ' +
      'Sawka et al. 2007, ACSM position stand on exercise and fluid replacement, Med Sci Sports Exerc 39(2): 377–390.',
    last_word: LAST_WORD,
  },
  sodium: {
    topic: 'sodium',
    title: 'Sodium figures are estimates',
    text:
      'No single published figure says how much sodium to take per hour. Ours is computed from the fluid range and the ' +
      'sodium content of sports drinks, and sweat sodium varies widely between people (about 35 mmol/L on average). ' +
      'Sodium does not make overdrinking safe. People on a low-sodium diet, with high blood pressure, or with heart or ' +
      'kidney conditions should ask their physician first.',
    source:
      'German Nutrition Society (DGE) working group position 2020 (400–1100 mg/L in sports drinks); Sawka et al. 2007 citing ' +
      'the Institute of Medicine (sweat sodium about 35 mmol/L).',
    last_word: LAST_WORD,
  },
  carbohydrate: {
    topic: 'carbohydrate',
    title: 'Train the gut before race day',
    text:
      'The ranges are general guidance, the same for every body mass. High intakes (over 60 g an hour) need a mix of ' +
      'glucose and fructose and practice on long runs; a stomach that is not used to them can cramp or empty itself. ' +
      'Race day repeats what training rehearsed.',
    source:
      'Jeukendrup 2014, Sports Med 44(Suppl 1): S25–S33; Thomas, Erdman & Burke 2016, ACSM / Academy of Nutrition and ' +
      'Dietetics / Dietitians of Canada joint position.',
    last_word: LAST_WORD,
  },
  caffeine: {
    topic: 'caffeine',
    title: 'Caffeine: check with your physician',
    text:
      'Caffeine affects people very differently and adds up quickly across gels, drinks and coffee. Pacewright shows the ' +
      'total and does not propose a dose: ask your physician what is safe for you, especially with a heart condition, ' +
      'high blood pressure, pregnancy or medication, and try it in training before a race.',
    source: 'No dose is given: none of the published sources we rely on (REFERENCES.md) is used for a caffeine range.',
    last_word: LAST_WORD,
  },
  'cold water': {
    topic: 'cold water',
    title: 'Cold-water immersion: optional, and not for everyone',
    text:
      'Sudden immersion in cold water sets off a cold-shock response: an involuntary gasp, fast breathing, a racing heart ' +
      'and a rise in blood pressure, and together with breath-holding or a face in the water it can disturb the heart ' +
      'rhythm. Enter gradually, keep your face out of the water, do not hold your breath, and never do it alone. People ' +
      'with heart disease or high blood pressure should ask a physician first. Studies that found a small benefit for ' +
      'soreness used about 10–15 °C for 10–15 minutes; the trials are small and of low quality, so treat it as optional, ' +
      'not a prescription. Regular cold-water immersion after strength training blunted strength and muscle gains in one ' +
      'study; endurance adaptations do not appear to be blunted.',
    source:
      'Cold shock: Datta & Tipton 2006, J Appl Physiol 100: 2057–2064; Shattock & Tipton 2012, J Physiol 590(14): 3219–3230; ' +
      'Tipton et al. 2017, Exp Physiol. Protocol: Machado et al. 2016, Sports Med 46(4): 503–514. Evidence: Bleakley et al. 2012, ' +
      'Cochrane CD008262. Adaptation: Roberts et al. 2015, J Physiol 593(18): 4285–4301; Petersen & Fyfe 2021, Front Sports Act ' +
      'Living. The practical advice is our own ' +
      'wording derived from these, not quoted from them.',
    last_word: 'A physician decides for you as an individual whether cold-water immersion is safe.',
  },
};

/** The cautions for the topics present, in the fixed order of `CAUTION_TOPICS`, each once. */
export function cautionsFor(topics: Iterable<CautionTopic>): Caution[] {
  const wanted = new Set(topics);
  return CAUTION_TOPICS.filter((t) => wanted.has(t)).map((t) => CAUTIONS[t]);
}

/**
 * Sentences about one cold-water immersion compared with what Machado et al. (2016) studied (10–15 °C, 10–15 min):
 * colder or longer than that is outside the studied range. Empty when inside it. Inputs are °C and minutes.
 */
export function coldWaterNotes(waterTempC: number, minutes: number): string[] {
  if (!Number.isFinite(waterTempC) || !Number.isFinite(minutes) || minutes < 0)
    throw new RangeError('Give a temperature and minutes.');
  const notes: string[] = [];
  const s = COLD_WATER_STUDIED;
  if (waterTempC < s.temp_c.low) notes.push(`Colder than the ${s.temp_c.low}–${s.temp_c.high} °C the pooled studies used.`);
  if (waterTempC > s.temp_c.high) notes.push(`Warmer than the ${s.temp_c.low}–${s.temp_c.high} °C the pooled studies used.`);
  if (minutes > s.minutes.high) notes.push(`Longer than the ${s.minutes.low}–${s.minutes.high} minutes the pooled studies used.`);
  return notes;
}
