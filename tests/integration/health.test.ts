import { describe, expect, it } from 'vitest';
import { api } from '../support/app';
import { alloyCatalogue } from '../../src/lib/alloys';

describe('GET /api/health', () => {
  it('reports every backing service up', async () => {
    const response = await api('/api/health');
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ status: 'ok', db: 'ok', storage: 'ok', mail: 'ok' });
  });
});

describe('GET /api/alloys', () => {
  it('lists the whole catalogue with slug, name, family and UNS number', async () => {
    const response = await api('/api/alloys');
    expect(response.status).toBe(200);
    const alloys = await response.json();
    expect(alloys).toEqual(alloyCatalogue.map(({ slug, name, family, uns }) => ({ slug, name, family, uns })));
  });

  it.each([
    // Source: UNS designations per ASTM E527 / SAE J1086 (Grade 2 and Grade 5 titanium, 304 stainless, C11000 copper).
    ['ti-grade-2', 'R50400'],
    ['ti-grade-5', 'R56400'],
    ['steel-304', 'S30400'],
    ['copper-c11000', 'C11000'],
  ])('%s carries UNS %s', async (slug, uns) => {
    const alloys: { slug: string; uns: string }[] = await (await api('/api/alloys')).json();
    expect(alloys.find((alloy) => alloy.slug === slug)?.uns).toBe(uns);
  });
});

describe('unknown routes', () => {
  it('answer 404, not 500', async () => {
    expect((await api('/api/no-such-route')).status).toBe(404);
    expect((await api('/no-such-page')).status).toBe(404);
  });
});
