import { describe, expect, it } from 'vitest';

// HTTP checks of the four tint routes against the built app started by the test harness.
// Expected colours come from the published anchors (Int. J. Biomaterials 2015, Table 1, via
// REFERENCES.md); the status codes are the API contract.
const baseUrl = process.env.OXBLOOM_TEST_BASE_URL ?? 'http://127.0.0.1:4331';

async function post(path: string, body: unknown, raw = false): Promise<{ status: number; body: any }> {
  const response = await fetch(new URL(path, baseUrl), {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: baseUrl },
    body: raw ? (body as string) : JSON.stringify(body),
  });
  const text = await response.text();
  return { status: response.status, body: text ? JSON.parse(text) : null };
}

const HEX = /^#[0-9a-f]{6}$/;

describe('POST /api/tint/ladder', () => {
  it('answers the titanium ladder with named steps', async () => {
    const { status, body } = await post('/api/tint/ladder', { alloy: 'ti-grade-2', fromNm: 0, toNm: 200, stepNm: 10 });
    expect(status).toBe(200);
    expect(body.alloy).toBe('ti-grade-2');
    expect(body.illuminant).toBe('D65');
    expect(body.steps).toHaveLength(21);
    for (const step of body.steps) {
      expect(step.hex).toMatch(HEX);
      expect(Object.keys(step.lab).sort()).toEqual(['a', 'b', 'l']);
      expect(Object.keys(step.oklab).sort()).toEqual(['a', 'b', 'l']);
      expect(typeof step.name).toBe('string');
    }
    // Source: Int. J. Biomaterials 2015, Table 1 — 50 nm is blue.
    expect(body.steps.find((step: any) => step.thicknessNm === 50).name).toBe('blue');
  });

  it('takes the warm-light option', async () => {
    const { status, body } = await post('/api/tint/ladder', { alloy: 'steel-1095', illuminant: 'A' });
    expect(status).toBe(200);
    expect(body.illuminant).toBe('A');
  });

  it.each([
    [{ alloy: 'unobtainium' }, 400, 'alloy'],
    [{ alloy: 'Ti Grade 2' }, 400, 'alloy'],
    [{ alloy: 'ti-grade-2', fromNm: 300, toNm: 100 }, 400, 'toNm'],
    [{ alloy: 'ti-grade-2', stepNm: -1 }, 400, 'stepNm'],
    [{ alloy: 'steel-304' }, 422, 'alloy'],
    [{ alloy: 'copper-c11000' }, 422, 'alloy'],
  ])('%j → %i naming %s', async (request, expectedStatus, field) => {
    const { status, body } = await post('/api/tint/ladder', request);
    expect(status).toBe(expectedStatus);
    expect(body.field).toBe(field);
    expect(body.error).toContain(field);
  });

  it('a body that is not JSON → 400', async () => {
    const { status } = await post('/api/tint/ladder', '{"alloy": ', true);
    expect(status).toBe(400);
  });
});

describe('POST /api/tint/predict', () => {
  it('1 h at 500 °C on Ti-6Al-4V is golden, on reference data', async () => {
    const { status, body } = await post('/api/tint/predict', { alloy: 'ti-grade-5', process: 'heat', temperatureC: 500, holdMinutes: 60 });
    expect(status).toBe(200);
    expect(body.alloy).toBe('ti-grade-5');
    // Source: Int. J. Biomaterials 2015, Table 1 — golden (the law passes through its 23 nm, so only the
    // colour word, which the optics give, is a check).
    expect(body.outcome).toBe('prediction');
    expect(body.atmosphere).toBe('air');
    expect(body.thicknessNm.low).toBeLessThan(body.thicknessNm.mid);
    expect(body.thicknessNm.high).toBeGreaterThan(body.thicknessNm.mid);
    expect(body.colour.name).toBe('gold');
    expect(body.colour.hex).toMatch(HEX);
    expect(body.band.length).toBeGreaterThan(2);
    expect(body.basis).toBe('reference');
    expect(body.couponCount).toBe(0);
    expect(Array.isArray(body.warnings)).toBe(true);
  });

  it('a forge-welding heat carries its warnings, even under argon with no prediction to give', async () => {
    const { status, body } = await post('/api/tint/predict', {
      alloy: 'ti-grade-5',
      process: 'heat',
      temperatureC: 1050,
      holdMinutes: 20,
      atmosphere: 'argon',
    });
    expect(status).toBe(200);
    // A visitor has no argon coupons: the reference data cover heats in air only.
    expect(body.outcome).toBe('none');
    expect(body.reason).toBe('argon-too-few-coupons');
    const codes = body.warnings.map((warning: any) => warning.code);
    expect(codes).toEqual(expect.arrayContaining(['forge-welding-range', 'fe-ti-eutectic', 'beta-transus', 'inert-gas']));
    for (const warning of body.warnings) expect(warning.source).toBeTruthy();
  });

  it('"other" atmospheres: no prediction, with the reason', async () => {
    const { status, body } = await post('/api/tint/predict', { alloy: 'ti-grade-5', process: 'heat', temperatureC: 600, holdMinutes: 60, atmosphere: 'other' });
    expect(status).toBe(200);
    expect(body.outcome).toBe('none');
    expect(body.reason).toBe('other-atmosphere');
  });

  it('steel past the temper range says so instead of giving the last colour', async () => {
    // Source: Great Soviet Encyclopedia, "Temper color": light grey at 330–350 °C is the last temper colour.
    const { status, body } = await post('/api/tint/predict', { alloy: 'steel-1095', process: 'heat', temperatureC: 450, holdMinutes: 30 });
    expect(status).toBe(200);
    expect(body.outcome).toBe('none');
    expect(body.reason).toBe('past-film-range');
    expect(body.message).toMatch(/past the temper range/);
  });

  it('anodizing at 60 V is rose (offset + slope fitted to published thicknesses)', async () => {
    // Source: Int. J. Biomaterials 2015, Table 1 — 60 V, pink/yellow.
    const { status, body } = await post('/api/tint/predict', { alloy: 'ti-grade-5', process: 'anodize', volts: 60 });
    expect(status).toBe(200);
    expect(body.outcome).toBe('prediction');
    expect(['second-order rose', 'second-order gold']).toContain(body.colour.name);
  });

  it('anodizing at 20 V is blue', async () => {
    // Source: Int. J. Biomaterials 2015, Table 1 — 20 V, blue.
    const { status, body } = await post('/api/tint/predict', { alloy: 'ti-grade-2', process: 'anodize', volts: 20 });
    expect(status).toBe(200);
    expect(body.colour.name).toBe('blue');
  });

  it.each([
    [{ alloy: 'unobtainium', process: 'heat', temperatureC: 500, holdMinutes: 10 }, 400, 'alloy'],
    [{ alloy: 'ti-grade-5', process: 'heat', temperatureC: 1601, holdMinutes: 10 }, 400, 'temperatureC'],
    [{ alloy: 'ti-grade-5', process: 'heat', temperatureC: -1, holdMinutes: 10 }, 400, 'temperatureC'],
    [{ alloy: 'ti-grade-5', process: 'heat', temperatureC: 500, holdMinutes: -5 }, 400, 'holdMinutes'],
    [{ alloy: 'ti-grade-5', process: 'bake', temperatureC: 500, holdMinutes: 10 }, 400, 'process'],
    [{ alloy: 'ti-grade-5', process: 'anodize', volts: -3 }, 400, 'volts'],
    [{ alloy: 'ti-grade-5', process: 'heat', temperatureC: 500, holdMinutes: 10, atmosphere: 'vacuum' }, 400, 'atmosphere'],
    [{ alloy: 'steel-316', process: 'heat', temperatureC: 500, holdMinutes: 10 }, 422, 'alloy'],
    [{ alloy: 'bronze-c51000', process: 'heat', temperatureC: 300, holdMinutes: 10 }, 422, 'alloy'],
    [{ alloy: 'zirconium-702', process: 'heat', temperatureC: 500, holdMinutes: 10 }, 422, 'alloy'],
    [{ alloy: 'steel-1084', process: 'anodize', volts: 20 }, 422, 'alloy'],
  ])('%j → %i naming %s', async (request, expectedStatus, field) => {
    const { status, body } = await post('/api/tint/predict', request);
    expect(status).toBe(expectedStatus);
    expect(body.field).toBe(field);
  });
});

describe('POST /api/tint/estimate', () => {
  it('a first-order blue gives 50 nm first and a second-order candidate after it', async () => {
    const ladder = await post('/api/tint/ladder', { alloy: 'ti-grade-5', fromNm: 50, toNm: 50, stepNm: 1 });
    const { status, body } = await post('/api/tint/estimate', { alloy: 'ti-grade-5', lab: ladder.body.steps[0].lab });
    expect(status).toBe(200);
    expect(body.candidates[0].thicknessNm).toBeCloseTo(50, 0);
    expect(body.candidates[0].deltaE00).toBeLessThan(1);
    expect(body.candidates.length).toBeGreaterThan(1);
    for (const candidate of body.candidates) {
      expect(candidate.hex).toMatch(HEX);
      expect(typeof candidate.name).toBe('string');
    }
  });

  it('takes a hex colour', async () => {
    const { status, body } = await post('/api/tint/estimate', { alloy: 'steel-1084', hex: '#1e6daf' });
    expect(status).toBe(200);
    expect(body.candidates.length).toBeGreaterThan(0);
  });

  it.each([
    [{ alloy: 'ti-grade-5', hex: 'bluish' }, 400, 'hex'],
    [{ alloy: 'ti-grade-5', hex: '#12' }, 400, 'hex'],
    [{ alloy: 'ti-grade-5' }, 400, 'hex'],
    [{ alloy: 'ti-grade-5', lab: { l: 120, a: 0, b: 0 } }, 400, 'lab.l'],
    [{ alloy: 'unobtainium', hex: '#336699' }, 400, 'alloy'],
    [{ alloy: 'brass-c26000', hex: '#336699' }, 422, 'alloy'],
  ])('%j → %i naming %s', async (request, expectedStatus, field) => {
    const { status, body } = await post('/api/tint/estimate', request);
    expect(status).toBe(expectedStatus);
    expect(body.field).toBe(field);
  });
});

describe('POST /api/tint/plan-pair', () => {
  it('titanium and steel share no calibrated temperature: no suggestions, and it says why', async () => {
    // Source: Int. J. Biomaterials 2015 (titanium anchors 500–600 °C) and the temper-colour tables
    // (Colvin & Juthe 1922, Great Soviet Encyclopedia: up to 350 °C) do not overlap.
    const { status, body } = await post('/api/tint/plan-pair', { alloys: ['ti-grade-5', 'steel-1084'] });
    expect(status).toBe(200);
    expect(body.suggestions).toEqual([]);
    expect(body.note).toMatch(/wider search/);
  });

  it('a range outside the calibrated temperatures is refused unless a wider search is asked for', async () => {
    const refused = await post('/api/tint/plan-pair', { alloys: ['ti-grade-5', 'steel-1084'], temperatureC: { min: 200, max: 340 } });
    expect(refused.status).toBe(422);
    expect(refused.body.field).toBe('temperatureC');
  });

  it('a wider search suggests the heats with the most contrast, each marked and warned', async () => {
    const { status, body } = await post('/api/tint/plan-pair', { alloys: ['ti-grade-5', 'steel-1084'], temperatureC: { min: 200, max: 340 }, widen: true });
    expect(status).toBe(200);
    expect(body.search.widened).toBe(true);
    expect(body.suggestions.length).toBeGreaterThan(0);
    for (const suggestion of body.suggestions) {
      expect(suggestion.temperatureC).toBeGreaterThanOrEqual(200);
      expect(suggestion.temperatureC).toBeLessThanOrEqual(340);
      expect(suggestion.layers.map((layer: any) => layer.alloy)).toEqual(['ti-grade-5', 'steel-1084']);
      for (const layer of suggestion.layers) expect(layer.hex).toMatch(HEX);
      // Below titanium's published anchors (500 and 600 °C): extrapolated, and it says so.
      expect(suggestion.outsideCalibrated).toBe(true);
      const codes = suggestion.warnings.map((warning: any) => warning.code);
      // Common practice (warnings.ts): colouring a hardened blade tempers it; hot work needs protection.
      expect(codes).toEqual(expect.arrayContaining(['outside-reference-range', 'tempers-hardened-steel', 'hot-work']));
    }
  });

  it('under argon without argon coupons, no suggestions and the reason', async () => {
    const { status, body } = await post('/api/tint/plan-pair', { alloys: ['ti-grade-2', 'ti-grade-5'], atmosphere: 'argon' });
    expect(status).toBe(200);
    expect(body.suggestions).toEqual([]);
    expect(body.note).toMatch(/air only/);
  });

  it('with a target, scores by ΔE00 to the wanted pair', async () => {
    const { status, body } = await post('/api/tint/plan-pair', {
      alloys: ['ti-grade-2', 'ti-grade-5'],
      target: ['#2c7ebd', '#2c7ebd'],
      holdMinutes: { min: 10, max: 120 },
    });
    expect(status).toBe(200);
    expect(body.suggestions[0].score).toBeLessThan(5);
    for (let i = 1; i < body.suggestions.length; i += 1) expect(body.suggestions[i].score).toBeGreaterThanOrEqual(body.suggestions[i - 1].score);
  });

  it.each([
    [{ alloys: ['ti-grade-5'] }, 400, 'alloys'],
    [{ alloys: ['ti-grade-5', 'unobtainium'] }, 400, 'alloys.1'],
    [{ alloys: ['ti-grade-5', 'steel-1084'], target: ['#2c7ebd', 'gold'] }, 400, 'target.1'],
    [{ alloys: ['ti-grade-5', 'steel-1084'], temperatureC: { min: 100, max: 2000 } }, 400, 'temperatureC.max'],
    [{ alloys: ['ti-grade-5', 'steel-1084'], holdMinutes: { min: -10, max: 30 } }, 400, 'holdMinutes.min'],
    [{ alloys: ['ti-grade-5', 'ti-grade-2'], widen: 'yes' }, 400, 'widen'],
    [{ alloys: ['ti-grade-5', 'ti-grade-2'], atmosphere: 'vacuum' }, 400, 'atmosphere'],
    [{ alloys: ['steel-304', 'ti-grade-5'] }, 422, 'alloys.0'],
    [{ alloys: ['ti-grade-5', 'zirconium-702'] }, 422, 'alloys.1'],
  ])('%j → %i naming %s', async (request, expectedStatus, field) => {
    const { status, body } = await post('/api/tint/plan-pair', request);
    expect(status).toBe(expectedStatus);
    expect(body.field).toBe(field);
  });
});
