import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createUser } from '../support/factories.ts';
import { signedInAgent, testApp } from '../support/test-app.ts';

type App = ReturnType<typeof testApp>;

async function bearerFor(app: App) {
  const { user, password } = await createUser();
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { Authorization: `Bearer ${token}` };
}

const HALF_M = 21097.5;
const MARATHON_M = 42195;

describe('GET /api/tools/equivalents', () => {
  it('for a half in 1:25:00, responds 200 with Riegel 10 633.151 s and Daniels & Gilbert 10 644.4 s for the marathon', async () => {
    const app = testApp();
    const auth = await bearerFor(app);

    const res = await request(app).get('/api/tools/equivalents').query({ distance_m: HALF_M, time_s: 5100 }).set(auth);

    expect(res.status).toBe(200);
    expect(Object.keys(res.body)).toEqual(['equivalents']);
    const rows = res.body.equivalents as Array<{ distance_m: number; riegel_s: number; daniels_gilbert_s: number }>;
    // api-contract.md: 1500, 1609.344, 3000, 5000, 10000, 15000, 21097.5 and 42195 m
    expect(rows.map((r) => r.distance_m)).toEqual([1500, 1609.344, 3000, 5000, 10000, 15000, 21097.5, 42195]);
    const marathon = rows.find((r) => r.distance_m === MARATHON_M)!;
    expect(Object.keys(marathon).sort()).toEqual(['daniels_gilbert_s', 'distance_m', 'riegel_s']);
    expect(marathon.riegel_s).toBeCloseTo(10633.151, 3); // REFERENCES.md §3.1
    expect(marathon.daniels_gilbert_s).toBeCloseTo(10644.4, 1); // REFERENCES.md §3.2
  });

  it('answers a session-cookie user too (a read needs no CSRF header)', async () => {
    const app = testApp();
    const { user, password } = await createUser();
    const { agent } = await signedInAgent(app, user.email, password);
    const res = await agent.get('/api/tools/equivalents?distance_m=5000&time_s=1200');
    expect(res.status).toBe(200);
    expect(res.body.equivalents).toHaveLength(8);
  });

  it.each<[string, Record<string, string | number>, string]>([
    ['distance_m is missing', { time_s: 5100 }, 'distance_m'],
    ['time_s is missing', { distance_m: HALF_M }, 'time_s'],
    ['distance_m is 0', { distance_m: 0, time_s: 5100 }, 'distance_m'],
    ['time_s is 0', { distance_m: HALF_M, time_s: 0 }, 'time_s'],
    ['distance_m is negative', { distance_m: -5000, time_s: 1200 }, 'distance_m'],
    ['time_s is negative', { distance_m: 5000, time_s: -1200 }, 'time_s'],
    ['distance_m is not a number', { distance_m: 'half', time_s: 5100 }, 'distance_m'],
    ['time_s is a clock time, not seconds', { distance_m: HALF_M, time_s: '1:25:00' }, 'time_s'],
    ['distance_m is over 250 km', { distance_m: 1_000_000, time_s: 360_000 }, 'distance_m'],
    ['time_s is over 100 hours', { distance_m: 100_000, time_s: 400_000 }, 'time_s'],
    ['the pace is faster than 1:00 per km (a marathon in 10 minutes)', { distance_m: MARATHON_M, time_s: 600 }, 'time_s'],
    ['the pace is slower than 30:00 per km (a 5K in 5 hours)', { distance_m: 5000, time_s: 18_000 }, 'time_s'],
    ['a value is Infinity', { distance_m: 'Infinity', time_s: 5100 }, 'distance_m'],
  ])('when %s, responds 400 with a field error', async (_name, query, field) => {
    const app = testApp();
    const auth = await bearerFor(app);

    const res = await request(app).get('/api/tools/equivalents').query(query).set(auth);

    expect(res.status).toBe(400);
    expect(typeof res.body.error).toBe('string');
    const details = res.body.details as Array<{ field: string; message: string }>;
    expect(details.map((d) => d.field)).toContain(field);
    for (const d of details) expect(d.message).toMatch(/\.$/); // sentences
  });

  it('when signed out, responds 401', async () => {
    const app = testApp();
    const res = await request(app).get('/api/tools/equivalents').query({ distance_m: HALF_M, time_s: 5100 });
    expect(res.status).toBe(401);
    expect(typeof res.body.error).toBe('string');
  });
});

describe('GET /api/tools/paces', () => {
  it('for a 3:00:00 marathon per mile: 411.9188 s/mi, 27 splits ending on the goal, 5 km checkpoints, training ranges', async () => {
    const app = testApp();
    const auth = await bearerFor(app);

    const res = await request(app).get('/api/tools/paces').query({ distance_m: MARATHON_M, time_s: 10800 }).set(auth);

    expect(res.status).toBe(200);
    expect(res.body.pace.s_per_mi).toBeCloseTo(411.9188, 4); // REFERENCES.md §1
    expect(res.body.pace.s_per_km).toBeCloseTo(255.9545, 4); // REFERENCES.md §1
    const table = res.body.split_table;
    expect(table.unit).toBe('mi');
    expect(table.negative_split_s).toBe(0);
    expect(table.splits).toHaveLength(27);
    expect(table.splits.at(-1).cumulative_s).toBeCloseTo(10800, 6);
    expect(table.checkpoints.map((c: { distance_m: number }) => c.distance_m)).toEqual([
      5000, 10000, 15000, 20000, 25000, 30000, 35000, 40000, 42195,
    ]);
    const ranges = res.body.training_ranges.ranges as Array<Record<string, unknown> & { kind: string; source: string }>;
    expect(ranges.map((r) => r.kind)).toEqual([
      'easy',
      'steady',
      'marathon-effort',
      'half-marathon-effort',
      '10k-effort',
      '5k-effort',
      'mile-effort',
    ]);
    // The result's own distance: marathon effort is the goal pace itself, 255.9545 s/km by both models (REFERENCES.md §1).
    const marathon = ranges.find((r) => r.kind === 'marathon-effort') as unknown as {
      shorthand: string;
      riegel: { s_per_km: number };
      daniels_gilbert: { s_per_km: number };
    };
    expect(marathon.shorthand).toBe('MP');
    expect(marathon.riegel.s_per_km).toBeCloseTo(255.9545, 4);
    expect(marathon.daniels_gilbert.s_per_km).toBeCloseTo(255.9545, 4);
    // Easy: 12–30 % more time per km than marathon effort (our own choice): 286.669–332.741 s/km.
    const easy = ranges.find((r) => r.kind === 'easy') as unknown as { fast: { s_per_km: number }; slow: { s_per_km: number } };
    expect(easy.fast.s_per_km).toBeCloseTo(286.669, 3);
    expect(easy.slow.s_per_km).toBeCloseTo(332.741, 3);
    for (const range of ranges) expect(range.source).toMatch(/^(Riegel \(1981\) and Daniels & Gilbert \(1979\)|our own choice)/);
    expect(res.body).not.toHaveProperty('training_paces');
    expect(JSON.stringify(res.body)).not.toMatch(/threshold|interval|repetition|VO2max|VO₂max/i);
  });

  it('with include=training_paces, also answers the deprecated field: earlier kind values mapped onto today’s ranges', async () => {
    const app = testApp();
    const auth = await bearerFor(app);

    const res = await request(app)
      .get('/api/tools/paces')
      .query({ distance_m: HALF_M, time_s: 5100, include: 'training_paces' })
      .set(auth);

    expect(res.status).toBe(200);
    const old = res.body.training_paces as { notice: string; index: number; ranges: Array<{ kind: string; fast: unknown }> };
    expect(old.notice).toMatch(/^Deprecated/);
    expect(old.index).toBeCloseTo(54.4535, 4); // REFERENCES.md §3.2
    expect(old.ranges).toHaveLength(5);
    const today = res.body.training_ranges.ranges as Array<{ kind: string; fast: unknown }>;
    expect(old.ranges[0]).toMatchObject({ kind: 'easy', fast: today.find((r) => r.kind === 'easy')!.fast });
  });

  it('when include names anything else, responds 400 with a field error', async () => {
    const app = testApp();
    const auth = await bearerFor(app);
    const res = await request(app).get('/api/tools/paces').query({ distance_m: 5000, time_s: 1200, include: 'bands' }).set(auth);
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([{ field: 'include', message: expect.stringMatching(/deprecated.*\.$/) }]);
  });

  it('the OpenAPI document marks the include parameter and the training_paces field deprecated', async () => {
    const res = await request(testApp()).get('/api/openapi.json');
    expect(res.status).toBe(200);
    const op = res.body.paths['/api/tools/paces'].get;
    const include = op.parameters.find((p: { name: string }) => p.name === 'include');
    expect(include).toMatchObject({ in: 'query', required: false, deprecated: true });
    const schema = op.responses['200'].content['application/json'].schema;
    expect(schema.properties.training_paces.deprecated).toBe(true);
    expect(schema.required).not.toContain('training_paces');
    expect(schema.required).toContain('training_ranges');
  });

  it('with unit=km and negative_split_s=120, runs two even halves two minutes apart', async () => {
    const app = testApp();
    const auth = await bearerFor(app);

    const res = await request(app)
      .get('/api/tools/paces')
      .query({ distance_m: HALF_M, time_s: 5400, unit: 'km', negative_split_s: 120 })
      .set(auth);

    expect(res.status).toBe(200);
    expect(res.body.split_table.unit).toBe('km');
    expect(res.body.split_table.splits).toHaveLength(22);
    expect(res.body.split_table.halves.map((h: { time_s: number }) => h.time_s)).toEqual([2760, 2640]);
  });

  it.each<[string, Record<string, string | number>, string]>([
    ['time_s is missing', { distance_m: 5000 }, 'time_s'],
    ['unit is yards', { distance_m: 5000, time_s: 1200, unit: 'yd' }, 'unit'],
    ['negative_split_s is below 0', { distance_m: 5000, time_s: 1200, negative_split_s: -10 }, 'negative_split_s'],
    [
      'negative_split_s is over a tenth of the goal',
      { distance_m: 5000, time_s: 1200, negative_split_s: 121 },
      'negative_split_s',
    ],
    ['distance_m is absurd', { distance_m: 1e12, time_s: 1200 }, 'distance_m'],
  ])('when %s, responds 400 with a field error', async (_name, query, field) => {
    const app = testApp();
    const auth = await bearerFor(app);
    const res = await request(app).get('/api/tools/paces').query(query).set(auth);
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
  });

  it('when signed out, responds 401', async () => {
    const res = await request(testApp()).get('/api/tools/paces').query({ distance_m: 5000, time_s: 1200 });
    expect(res.status).toBe(401);
  });
});
