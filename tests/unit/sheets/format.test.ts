import { describe, expect, it } from 'vitest';
import { formatTemperature, heatLines, removedNote } from '~/lib/sheets/format';
import { updateSheetSchema } from '~/lib/sheets/requests';

const shown = { hideTemperature: false, hideHold: false, hideProcess: false, hideAlloy: false };
const heat = { temperatureC: 300, holdSeconds: 1800, process: 'oven', alloys: ['Titanium Grade 2'] };

describe('a swatch’s printed heat record', () => {
  it('prints in the sheet’s units', () => {
    // Source: °F = °C × 9/5 + 32 (definition of the Fahrenheit scale): 300 °C = 572 °F.
    expect(formatTemperature(300, 'f')).toBe('572 °F');
    expect(formatTemperature(300, 'c')).toBe('300 °C');
  });

  it('leaves out each hidden field', () => {
    expect(heatLines(heat, shown, 'c')).toEqual(['300 °C · 30 min', 'Oven or kiln', 'Titanium Grade 2']);
    expect(heatLines(heat, { ...shown, hideTemperature: true, hideAlloy: true }, 'c')).toEqual(['30 min', 'Oven or kiln']);
    expect(heatLines(heat, { hideTemperature: true, hideHold: true, hideProcess: true, hideAlloy: true }, 'c')).toEqual([]);
  });

  it('tells the owner how many swatches left the sheet', () => {
    expect(removedNote(0)).toBeNull();
    expect(removedNote(1)).toBe('1 swatch was removed: its coupon is no longer shared or was deleted.');
    expect(removedNote(2)).toBe('2 swatches were removed: their coupons are no longer shared or were deleted.');
  });
});

describe('the change request', () => {
  it('names the entry at fault', () => {
    const result = updateSheetSchema.safeParse({ items: [{ kind: 'heading', text: 'ok' }, { kind: 'swatch' }] });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0].path).toEqual(['items', 1, 'swatchId']);
  });

  it('refuses unknown fields and more than 200 entries', () => {
    expect(updateSheetSchema.safeParse({ owner: 'me' }).success).toBe(false);
    expect(updateSheetSchema.safeParse({ items: Array.from({ length: 201 }, () => ({ kind: 'heading', text: 'x' })) }).success).toBe(false);
  });
});
