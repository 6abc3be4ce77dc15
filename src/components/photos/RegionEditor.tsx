import { useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import { layerLabel, type PhotoLayer, type PhotoView, type Rectangle, type RegionInput } from '~/lib/photos';
import { isBigEnough, keyStep, moved, placement, resized, spanned, toPhotoPoint, type Point } from './region-geometry';

/** A region being edited: which layer (or the grey card) it marks, and where. */
export type Marks = Record<string, Rectangle>;
export const GREY = 'grey';
const layerMark = (layerId: number) => `layer:${layerId}`;

/** Outline colours per layer, chosen to stand out on oxide tints; the grey card is drawn in white. */
const OUTLINES = ['#ffd23f', '#3fe0ff', '#ff6fd8', '#8dff5a', '#ff9f43', '#c39bff', '#ffffff', '#5af0b0'];

export function marksOf(photo: PhotoView): Marks {
  const marks: Marks = {};
  for (const { kind, layerId, x, y, width, height } of photo.regions) marks[kind === 'grey' ? GREY : layerMark(layerId!)] = { x, y, width, height };
  return marks;
}

/** The grey card's reflectance (percent) as saved, or '' for a standard card: what its field starts with. */
export function reflectanceOf(photo: PhotoView): string {
  const reflectance = photo.regions.find((region) => region.kind === 'grey')?.reflectance;
  return reflectance === null || reflectance === undefined ? '' : String(reflectance);
}

/** The marks as the API takes them: layers in their order, then the grey card with its reflectance when one is typed. */
export function regionsOf(marks: Marks, layers: PhotoLayer[], greyReflectance = ''): RegionInput[] {
  const regions: RegionInput[] = [];
  for (const layer of layers) {
    const mark = marks[layerMark(layer.id)];
    if (mark) regions.push({ kind: 'layer', layerId: layer.id, ...mark });
  }
  const typed = greyReflectance.trim().replace(',', '.');
  if (marks[GREY]) regions.push({ kind: 'grey', ...marks[GREY], ...(typed ? { reflectance: Number(typed) } : {}) });
  return regions;
}

interface Drag {
  mode: 'draw' | 'move' | 'resize';
  mark: string;
  start: Point;
  original?: Rectangle;
}

interface Props {
  photo: PhotoView;
  layers: PhotoLayer[];
  marks: Marks;
  editable: boolean;
  onChange: (marks: Marks) => void;
}

/**
 * The display image with its regions. The owner draws a rectangle per layer (and one on a grey
 * card) by dragging, moves one by dragging it, resizes it by its corner, and deletes it by its ×;
 * all with pointer events, so mouse, pen and touch work alike, and with the keyboard.
 */
export default function RegionEditor({ photo, layers, marks, editable, onChange }: Props) {
  const box = useRef<HTMLDivElement>(null);
  const drag = useRef<Drag | null>(null);
  const firstOpen = layers.find((layer) => !marks[layerMark(layer.id)]);
  const [tool, setTool] = useState<string>(firstOpen ? layerMark(firstOpen.id) : GREY);
  const size = { width: photo.width, height: photo.height };

  const kinds = [
    ...layers.map((layer, index) => ({
      mark: layerMark(layer.id),
      label: layerLabel(layer),
      short: `${layer.position + 1}`,
      colour: OUTLINES[index % OUTLINES.length],
    })),
    { mark: GREY, label: 'Grey card', short: 'Grey', colour: '#ffffff' },
  ];
  const kindOf = (mark: string) => kinds.find((kind) => kind.mark === mark);

  const pointAt = (event: PointerEvent) => toPhotoPoint({ x: event.clientX, y: event.clientY }, box.current!.getBoundingClientRect(), size);
  const withMark = (mark: string, rectangle: Rectangle | undefined) => {
    const next = { ...marks };
    if (rectangle) next[mark] = rectangle;
    else delete next[mark];
    onChange(next);
  };

  function onPointerDown(event: PointerEvent<HTMLDivElement>) {
    if (!editable || event.button > 0) return;
    const target = event.target as HTMLElement;
    if (target.closest('button')) return;
    const regionElement = target.closest<HTMLElement>('[data-mark]');
    const start = pointAt(event);
    if (regionElement) {
      const mark = regionElement.dataset.mark!;
      drag.current = { mode: target.dataset.handle ? 'resize' : 'move', mark, start, original: marks[mark] };
    } else {
      drag.current = { mode: 'draw', mark: tool, start, original: marks[tool] };
      withMark(tool, spanned(start, start, size));
    }
    event.currentTarget.setPointerCapture(event.pointerId);
    event.preventDefault();
  }

  function onPointerMove(event: PointerEvent<HTMLDivElement>) {
    const current = drag.current;
    if (!current) return;
    const point = pointAt(event);
    const dx = point.x - current.start.x;
    const dy = point.y - current.start.y;
    if (current.mode === 'draw') withMark(current.mark, spanned(current.start, point, size));
    else if (current.mode === 'move') withMark(current.mark, moved(current.original!, dx, dy, size));
    else withMark(current.mark, resized(current.original!, dx, dy, size));
  }

  function onPointerEnd(event: PointerEvent<HTMLDivElement>) {
    const current = drag.current;
    if (!current) return;
    drag.current = null;
    if (current.mode !== 'draw') return;
    const drawn = spanned(current.start, pointAt(event), size);
    if (!isBigEnough(drawn, size)) return withMark(current.mark, current.original);
    withMark(current.mark, drawn);
    // On to the next layer still unmarked, so marking a laminate is drag, drag, drag.
    const next = layers.find((layer) => layerMark(layer.id) !== current.mark && !marks[layerMark(layer.id)]);
    if (next) setTool(layerMark(next.id));
  }

  /** Removes a rectangle and makes its kind the one drawn next. */
  function remove(mark: string) {
    withMark(mark, undefined);
    setTool(mark);
  }

  /** Enter or Space on the photo places a rectangle of the chosen kind in its middle, to move and size with the keys. */
  function onPhotoKeyDown(event: KeyboardEvent<HTMLDivElement>) {
    if (event.target !== event.currentTarget || (event.key !== 'Enter' && event.key !== ' ')) return;
    event.preventDefault();
    const middle = { x: size.width / 2, y: size.height / 2 };
    const half = { x: size.width / 8, y: size.height / 8 };
    const mark = tool;
    withMark(mark, spanned({ x: middle.x - half.x, y: middle.y - half.y }, { x: middle.x + half.x, y: middle.y + half.y }, size));
    const next = layers.find((layer) => layerMark(layer.id) !== mark && !marks[layerMark(layer.id)]);
    if (next) setTool(layerMark(next.id));
    requestAnimationFrame(() => box.current?.querySelector<HTMLElement>(`[data-mark="${mark}"]`)?.focus());
  }

  function onKeyDown(event: KeyboardEvent<HTMLDivElement>, mark: string) {
    const rectangle = marks[mark];
    if (event.key === 'Delete' || event.key === 'Backspace') {
      event.preventDefault();
      return remove(mark);
    }
    const direction = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] }[event.key];
    if (!direction) return;
    event.preventDefault();
    const step = keyStep(size, event.altKey);
    const [dx, dy] = [direction[0] * step, direction[1] * step];
    withMark(mark, event.shiftKey ? resized(rectangle, dx, dy, size) : moved(rectangle, dx, dy, size));
  }

  return (
    <div className="space-y-2">
      {editable && (
        <div className="flex flex-wrap items-center gap-2" role="toolbar" aria-label="What to mark">
          <span className="text-sm font-medium text-ash-700">Mark:</span>
          {kinds.map((kind) => (
            <button
              key={kind.mark}
              type="button"
              className={`btn min-h-9 px-3 py-1 text-sm ${tool === kind.mark ? 'border-ash-900 bg-ash-100' : ''}`}
              aria-pressed={tool === kind.mark}
              onClick={() => setTool(kind.mark)}
            >
              <span className="inline-block h-3 w-3 rounded-sm border border-ash-700" style={{ background: kind.colour }} aria-hidden="true" />
              {kind.label}
              {marks[kind.mark] && <span aria-label="marked"> ✓</span>}
            </button>
          ))}
        </div>
      )}
      <div
        ref={box}
        className={`relative overflow-hidden rounded-md bg-ash-900 select-none ${editable ? 'cursor-crosshair' : ''}`}
        style={editable ? { touchAction: 'pinch-zoom' } : undefined}
        onPointerDown={onPointerDown}
        onPointerMove={onPointerMove}
        onPointerUp={onPointerEnd}
        onPointerCancel={onPointerEnd}
        tabIndex={editable ? 0 : undefined}
        role={editable ? 'group' : undefined}
        aria-label={editable ? 'Photo: Enter places a rectangle of the chosen kind' : undefined}
        onKeyDown={editable ? onPhotoKeyDown : undefined}
        data-testid="photo-canvas"
      >
        <img src={photo.displayUrl} alt="Photo of the coupon" width={photo.width} height={photo.height} className="block h-auto w-full" draggable={false} />
        {Object.entries(marks).map(([mark, rectangle]) => {
          const kind = kindOf(mark);
          if (!kind) return null;
          return (
            <div
              key={mark}
              data-mark={mark}
              role="group"
              aria-label={`${kind.label} region`}
              tabIndex={editable ? 0 : undefined}
              onKeyDown={editable ? (event) => onKeyDown(event, mark) : undefined}
              className={`absolute ${editable ? 'cursor-move' : ''}`}
              style={{
                ...placement(rectangle, size),
                border: `2px ${mark === GREY ? 'dashed' : 'solid'} ${kind.colour}`,
                boxShadow: '0 0 0 1px rgb(0 0 0 / 0.7), inset 0 0 0 1px rgb(0 0 0 / 0.7)',
              }}
            >
              <span
                className="absolute left-0 top-0 flex items-center gap-1 px-1 text-xs font-semibold leading-5 text-ash-900"
                style={{ background: kind.colour }}
              >
                {kind.short}
                {editable && (
                  <button type="button" className="leading-none" aria-label={`Delete the ${kind.label} region`} onClick={() => remove(mark)}>
                    ×
                  </button>
                )}
              </span>
              {editable && (
                <span
                  data-handle="resize"
                  className="absolute -bottom-2 -right-2 h-4 w-4 cursor-nwse-resize rounded-full border-2 border-ash-900"
                  style={{ background: kind.colour }}
                  aria-hidden="true"
                />
              )}
            </div>
          );
        })}
      </div>
      {editable && (
        <p className="field-hint">
          Drag on the photo to mark the chosen layer; drag a rectangle to move it, its corner to resize it. With the keyboard: Enter on the photo places a
          rectangle of the chosen kind, arrows move a rectangle, Shift and arrows resize it, Delete removes it.
        </p>
      )}
    </div>
  );
}
