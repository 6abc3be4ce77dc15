// Colour sheet figure (BRIEF.md "Figures it must reach"): a 60-swatch sheet's PDF, drawn in
// process from a loaded sheet (headings, captions and the model's colour beside each swatch), fonts
// embedded. The database read before it is a handful of indexed queries and not timed here.
import { renderSheetPdf } from '~/lib/server/sheets/pdf';
import type { SheetEntry, SheetView } from '~/lib/server/sheets/view';
import { heatLines } from '~/lib/sheets/format';
import { ms, printTable, time, type Row } from './report';

const shown = { hideTemperature: false, hideHold: false, hideProcess: false, hideAlloy: false };
const entries: SheetEntry[] = [];
for (let i = 0; i < 60; i++) {
  if (i % 15 === 0) entries.push({ kind: 'heading', id: 1000 + i, text: `Group ${i / 15 + 1}: ${300 + i * 5} to ${370 + i * 5} °C` });
  const heat = { temperatureC: 300 + i * 5, holdSeconds: 600, process: 'oven', alloys: ['Titanium Grade 2'] };
  const channel = (offset: number) => ((i * offset + 60) % 256).toString(16).padStart(2, '0');
  entries.push({
    kind: 'swatch',
    id: i + 1,
    swatchId: i + 1,
    couponId: i + 1,
    hex: `#${channel(37)}${channel(71)}${channel(113)}`,
    lab: [40 + (i % 40), (i % 20) - 10, 30 - (i % 50)],
    couponTitle: `Coupon ${i + 1}`,
    heat,
    caption: i % 2 ? 'Even straw across the face, darker at the edge' : '',
    ...shown,
    lines: heatLines(heat, shown, 'c'),
    prediction: { hex: '#b08850', name: 'bronze', note: 'model' },
    available: true,
    changed: false,
  });
}
const view: SheetView = {
  id: 1,
  title: 'Temper colours on titanium, oven in air',
  intro: 'Sixty coupons from a class, heated for ten minutes each at five-degree steps. Compare with your own coupons before trusting a colour.',
  classId: 1,
  className: 'Spring heat colours',
  ownerName: 'Saltmarsh Forge Collective',
  units: 'c',
  pageSize: 'a4',
  orientation: 'portrait',
  status: 'published',
  audience: 'class',
  showPrediction: true,
  publishedAt: new Date(),
  updatedAt: new Date(),
  canEdit: false,
  entries,
  note: null,
};

const a4 = await time(() => renderSheetPdf(view, 'a4'), 10, 2);
const letter = await time(() => renderSheetPdf(view, 'letter'), 10, 2);
const rows: Row[] = [
  { what: '60-swatch sheet PDF, A4 (median)', measured: ms(a4.median), target: '≤ 1 s', met: a4.median <= 1000 },
  { what: '60-swatch sheet PDF, A4 (p95)', measured: ms(a4.p95) },
  { what: '60-swatch sheet PDF, Letter (median)', measured: ms(letter.median), target: '≤ 1 s', met: letter.median <= 1000 },
];
printTable(rows);
if (rows.some((row) => row.met === false)) process.exitCode = 1;
