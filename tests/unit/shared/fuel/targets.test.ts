import { describe, expect, it } from 'vitest';
import {
  bodyMassShare,
  carbohydrateBand,
  carbohydrateInDrinkG,
  JEUKENDRUP_2014_BANDS,
  JOINT_POSITION_2016_BANDS,
  ML_PER_US_FL_OZ,
  mlToUsFlOz,
  proposeCarbohydrateTarget,
  proposeFluidTarget,
  proposeSodiumTarget,
  proposeTargets,
  saltGPerLFromSodiumMmol,
  servingsNeeded,
  sodiumMgInSalt,
  sodiumMgPerLFromMmol,
  sodiumMmolFromMgPerL,
  sweatRate,
  sweatSodiumLossMgPerH,
  usFlOzToMl,
} from '../../../../shared/fuel/targets.ts';

const H = 3600;
const MARATHON_330 = 3.5 * H;

describe('carbohydrate targets (Jeukendrup 2014; Thomas, Erdman & Burke 2016 joint position)', () => {
  it.each([
    // [duration, low, high]: proposed target per hour
    [20 * 60, 0, 0], // < 45 min: not needed (joint position, from memory)
    [44 * 60, 0, 0],
    [45 * 60, 0, null], // 45–75 min: mouth rinse or small amounts, no figure (Jeukendrup abstract, confirmed)
    [74 * 60, 0, null],
    [75 * 60, 30, 60], // 1–2.5 h: 30–60 g/h (joint position table, from memory)
    [2.5 * H - 1, 30, 60],
    [2.5 * H, 60, 90], // ≥ 2.5 h: up to 90 g/h (Jeukendrup, GSSI SSE #108, confirmed); 60 g/h single-source limit
    [5 * H, 60, 90],
  ])('%d s → %d–%s g/h', (duration, low, high) => {
    const t = proposeCarbohydrateTarget(duration);
    expect([t.low, t.high, t.unit]).toEqual([low, high, 'g/h']);
    expect(t.source).toMatch(/Jeukendrup 2014|Thomas, Erdman & Burke 2016/);
  });

  it('labels the 1–2.5 h band as from memory, and names both sources beside it', () => {
    const t = proposeCarbohydrateTarget(2 * H);
    expect(t.evidence).toBe('from memory');
    expect(t.note).toContain('Joint position 2016: 30–60 g/h');
    expect(t.note).toContain('Jeukendrup 2014: about 60 g/h');
    expect(proposeCarbohydrateTarget(1.5 * H).note).toContain('up to 30 g/h (figure band from memory)');
  });

  it('3:30:00 marathon: 60 g/h → 210 g, 90 g/h → 315 g (REFERENCES.md §7, fueling.py)', () => {
    const t = proposeCarbohydrateTarget(MARATHON_330);
    expect(t.low * 3.5).toBe(210);
    expect(t.high! * 3.5).toBe(315);
  });

  it('Jeukendrup bands: < 30 min none, 30–75 min mouth rinse, 1–2 h up to 30 (from memory), ≥ 2.5 h up to 90', () => {
    expect(carbohydrateBand(JEUKENDRUP_2014_BANDS, 29 * 60).advice).toBe('not needed');
    expect(carbohydrateBand(JEUKENDRUP_2014_BANDS, 30 * 60).advice).toBe('mouth rinse or small amounts');
    expect(carbohydrateBand(JEUKENDRUP_2014_BANDS, 90 * 60)).toMatchObject({ high: 30, evidence: 'from memory' });
    expect(carbohydrateBand(JEUKENDRUP_2014_BANDS, 2.2 * H)).toMatchObject({ high: 60, evidence: 'confirmed' });
    expect(carbohydrateBand(JEUKENDRUP_2014_BANDS, 2.5 * H)).toMatchObject({ high: 90, evidence: 'confirmed' });
    expect(carbohydrateBand(JOINT_POSITION_2016_BANDS, 2 * H)).toMatchObject({ low: 30, high: 60 });
  });

  it.each([0, -1, Number.NaN, Infinity])('refuses a duration of %s', (d) => {
    expect(() => proposeCarbohydrateTarget(d)).toThrow(RangeError);
  });

  it('60 g/h over a 2 h 30 min run from 25 g gels is 6 gels (issue 6)', () => {
    expect(servingsNeeded(60, 2.5 * H, 25)).toBe(6);
    expect(servingsNeeded(90, MARATHON_330, 25)).toBe(13); // 315 / 25 = 12.6
    expect(servingsNeeded(0, H, 25)).toBe(0);
    expect(() => servingsNeeded(60, H, 0)).toThrow(RangeError);
  });
});

describe('fluid (Sawka et al. 2007, ACSM; Hew-Butler et al. 2015)', () => {
  it('starting range 0.4–0.8 L/h, seen only in secondary sources, with the caution against drinking beyond thirst', () => {
    const t = proposeFluidTarget(MARATHON_330);
    expect([t.low, t.high, t.unit, t.evidence]).toEqual([400, 800, 'ml/h', 'secondary']);
    expect(t.source).toContain('Sawka et al. 2007');
    expect(t.source).toContain('Hew-Butler et al. 2015');
    expect(t.note).toMatch(/never so much that you gain weight/);
  });

  it('3:30:00 marathon: 1.40–2.80 L = 47.3–94.7 US fl oz (REFERENCES.md §7)', () => {
    const t = proposeFluidTarget(MARATHON_330);
    expect((t.low * 3.5) / 1000).toBeCloseTo(1.4, 10);
    expect((t.high! * 3.5) / 1000).toBeCloseTo(2.8, 10);
    expect(mlToUsFlOz(t.low * 3.5).toFixed(1)).toBe('47.3');
    expect(mlToUsFlOz(t.high! * 3.5).toFixed(1)).toBe('94.7');
  });

  it('with a sweat rate: at most the sweat, at least enough to keep the loss under 2 % (computed)', () => {
    // 1.0 L/h, 70 kg, 3.5 h: 2 % = 1.4 kg over 3.5 h = 0.4 L/h may go unreplaced → 600–1000 ml/h.
    const t = proposeFluidTarget(MARATHON_330, { sweat_l_per_h: 1.0, body_mass_kg: 70 });
    expect(t.low).toBeCloseTo(600, 9);
    expect(t.high).toBeCloseTo(1000, 9);
    expect(t.evidence).toBe('computed');
    expect(proposeFluidTarget(H, { sweat_l_per_h: 0.5, body_mass_kg: 70 }).low).toBe(0);
  });
});

describe('sweat rate and the 2 % threshold (Sawka et al. 2007)', () => {
  it('70 → 68.9 kg, 0.5 L drunk, 1.5 h → 1.0667 L/h, −1.571 % (REFERENCES.md §7, verified)', () => {
    const r = sweatRate({ pre_kg: 70, post_kg: 68.9, drank_l: 0.5, duration_s: 1.5 * H });
    expect(r.l_per_h).toBeCloseTo(1.0667, 4);
    expect(r.body_mass_change_pct).toBeCloseTo(-1.571, 3);
    expect(r.over_threshold).toBe(false);
  });

  it('urine counts against the sweat; a loss over 2 % is flagged', () => {
    const r = sweatRate({ pre_kg: 60, post_kg: 58.5, drank_l: 0, urine_l: 0.3, duration_s: 2 * H });
    expect(r.l_per_h).toBeCloseTo(0.6, 10);
    expect(r.over_threshold).toBe(true);
  });

  it.each([
    [{ pre_kg: 0, post_kg: 68.9, drank_l: 0.5, duration_s: 5400 }],
    [{ pre_kg: 70, post_kg: 68.9, drank_l: -0.5, duration_s: 5400 }],
    [{ pre_kg: 70, post_kg: 68.9, drank_l: 0.5, duration_s: 0 }],
    [{ pre_kg: 70, post_kg: 72, drank_l: 0.5, duration_s: 5400 }], // negative sweat
  ])('refuses %j', (test) => {
    expect(() => sweatRate(test)).toThrow(RangeError);
  });

  it.each([
    [55, 1.1, 2.425],
    [70, 1.4, 3.086],
    [85, 1.7, 3.748],
  ])('2 %% of %d kg = %d kg (%d lb) (REFERENCES.md §7)', (mass, kg, lb) => {
    const s = bodyMassShare(mass);
    expect(s.kg).toBeCloseTo(kg, 10);
    expect(s.lb).toBeCloseTo(lb, 3);
  });

  it('refuses a body mass of 0 kg', () => {
    expect(() => bodyMassShare(0)).toThrow(RangeError);
  });
});

describe('sodium (ACSM 2007 citing the IOM; DGE 2020)', () => {
  it.each([
    // REFERENCES.md §7 table: mmol/L, mg/L Na, g/L NaCl
    [20, 459.8, 1.1689],
    [30, 689.69, 1.7533],
    [35, 804.64, 2.0455],
    [50, 1149.49, 2.9221],
    [70, 1609.28, 4.091],
  ])('%d mmol/L = %d mg/L Na = %d g/L NaCl', (mmol, mg, nacl) => {
    expect(sodiumMgPerLFromMmol(mmol)).toBeCloseTo(mg, 2);
    expect(saltGPerLFromSodiumMmol(mmol)).toBeCloseTo(nacl, 4);
    expect(sodiumMmolFromMgPerL(sodiumMgPerLFromMmol(mmol))).toBeCloseTo(mmol, 10);
  });

  it('0.5–0.7 g/L Na = 21.7–30.4 mmol/L; 1 g NaCl = 393.4 mg Na', () => {
    expect(sodiumMmolFromMgPerL(500)).toBeCloseTo(21.7, 1);
    expect(sodiumMmolFromMgPerL(700)).toBeCloseTo(30.4, 1);
    expect(sodiumMgInSalt(1)).toBeCloseTo(393.4, 1);
  });

  it.each([
    [0.5, 402],
    [1.0, 805],
    [1.5, 1207],
  ])('sweat %d L/h at 35 mmol/L loses %d mg Na/h', (rate, mg) => {
    expect(Math.round(sweatSodiumLossMgPerH(rate))).toBe(mg);
  });

  it('target = fluid range × 400–1100 mg/L (DGE 2020), computed; the low end only over 1.5 h', () => {
    const fluid = proposeFluidTarget(MARATHON_330);
    const t = proposeSodiumTarget(MARATHON_330, fluid);
    expect([t.low, t.high, t.unit, t.evidence]).toEqual([160, 880, 'mg/h', 'computed']);
    expect(t.source).toContain('DGE');
    expect(t.note).toContain('No single published mg-per-hour figure');
    expect(proposeSodiumTarget(H, fluid).low).toBe(0);
    expect(proposeSodiumTarget(MARATHON_330, fluid, 1.0).note).toContain('about 805 mg/h');
  });

  it('refuses a negative concentration', () => {
    expect(() => sodiumMgPerLFromMmol(-1)).toThrow(RangeError);
  });
});

describe('volumes (NIST Handbook 44: 1 US fl oz = 29.5735295625 mL exactly)', () => {
  it.each([
    [150, 5.0721],
    [250, 8.4535],
    [500, 16.907],
    [750, 25.3605],
  ])('%d mL = %d US fl oz', (ml, oz) => {
    expect(mlToUsFlOz(ml)).toBeCloseTo(oz, 4);
  });

  it('round-trips and 1 L = 33.8140227018 fl oz', () => {
    expect(usFlOzToMl(1)).toBe(ML_PER_US_FL_OZ);
    expect(mlToUsFlOz(1000)).toBeCloseTo(33.8140227018, 9);
  });

  it('a 6 % drink is 60 g/L, so 500 mL carries 30 g; 8 % → 80 g/L', () => {
    expect(carbohydrateInDrinkG(6, 500)).toBe(30);
    expect(carbohydrateInDrinkG(8, 1000)).toBe(80);
    expect(() => carbohydrateInDrinkG(6, -1)).toThrow(RangeError);
  });
});

describe('proposeTargets', () => {
  it('gives carbohydrate, fluid and sodium, each with low, high, unit, source and note', () => {
    const t = proposeTargets({ duration_s: MARATHON_330 });
    expect(Object.keys(t).sort()).toEqual(['carbohydrate', 'fluid', 'sodium']);
    for (const target of Object.values(t)) {
      expect(target).toEqual(
        expect.objectContaining({
          low: expect.any(Number),
          unit: expect.any(String),
          source: expect.any(String),
          note: expect.any(String),
        }),
      );
    }
  });

  it('uses the sweat rate only with a body mass', () => {
    expect(proposeTargets({ duration_s: MARATHON_330, sweat_l_per_h: 1 }).fluid.evidence).toBe('secondary');
    expect(proposeTargets({ duration_s: MARATHON_330, sweat_l_per_h: 1, body_mass_kg: 70 }).fluid.evidence).toBe('computed');
  });
});
