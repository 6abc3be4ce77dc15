import { useEffect, useRef, useState, type DragEvent, type FormEvent, type KeyboardEvent } from 'react';
import { callApi } from '~/components/api-client';
import type { Orientation, PageSizeName, SheetAudience, SheetStatus, SheetUnits } from '~/lib/sheets/requests';
import { alloyCatalogue } from '~/lib/alloys';
import { labels } from '~/lib/heat-record-text';
import { libraryPickQuery, libraryPicks, noLibraryFilters, type LibraryCouponAnswer, type LibraryPickFilters } from '~/lib/sheets/library-picks';

/** A swatch the builder can place: from the class, the instructor's own coupons, the library's filters or a colour search. */
export interface Pick {
  swatchId: number;
  hex: string;
  couponTitle: string;
}

type Annotation = { caption: string; hideTemperature: boolean; hideHold: boolean; hideProcess: boolean; hideAlloy: boolean };
export type BuilderItem =
  | { key: string; kind: 'heading'; text: string }
  | ({ key: string; kind: 'swatch'; itemId: number; swatchId: number | null; hex: string; label: string; available: boolean } & Annotation);

export interface BuilderSettings {
  title: string;
  intro: string;
  classId: number | null;
  units: SheetUnits;
  pageSize: PageSizeName;
  orientation: Orientation;
  audience: SheetAudience;
  showPrediction: boolean;
}

interface Props {
  sheetId: number;
  initial: BuilderSettings;
  status: SheetStatus;
  items: BuilderItem[];
  note: string | null;
  classes: { id: number; name: string }[];
  fromClass: Pick[];
  own: Pick[];
}

const noAnnotation: Annotation = { caption: '', hideTemperature: false, hideHold: false, hideProcess: false, hideAlloy: false };
let counter = 0;
const newKey = () => `n${(counter += 1)}`;

function toRequest(items: BuilderItem[]) {
  return items.map((item) => {
    if (item.kind === 'heading') return { kind: 'heading' as const, text: item.text || 'Untitled group' };
    const { caption, hideTemperature, hideHold, hideProcess, hideAlloy } = item;
    const target = item.swatchId !== null && item.available ? { swatchId: item.swatchId } : { itemId: item.itemId };
    return { kind: 'swatch' as const, ...target, caption, hideTemperature, hideHold, hideProcess, hideAlloy };
  });
}

/** Builds a colour sheet: pick, arrange (drag, or keys and buttons), annotate; saves itself. */
export default function SheetBuilder({ sheetId, initial, status: initialStatus, items: initialItems, note, classes, fromClass, own }: Props) {
  const [settings, setSettings] = useState(initial);
  const [items, setItems] = useState(initialItems);
  const [status, setStatus] = useState(initialStatus);
  const [save, setSave] = useState<{ state: 'saved' | 'saving' | 'error'; message?: string }>({ state: 'saved' });
  const [announcement, setAnnouncement] = useState('');
  const [source, setSource] = useState<'class' | 'own' | 'library' | 'search'>(fromClass.length ? 'class' : 'own');
  const [filters, setFilters] = useState<LibraryPickFilters>(noLibraryFilters);
  const [libraryFound, setLibraryFound] = useState<Pick[]>([]);
  const [libraryMessage, setLibraryMessage] = useState('');
  const [searchHex, setSearchHex] = useState('#c8a060');
  const [found, setFound] = useState<Pick[]>([]);
  const [searchMessage, setSearchMessage] = useState('');
  const dragFrom = useRef<number | null>(null);
  const first = useRef(true);

  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    setSave({ state: 'saving' });
    const timer = setTimeout(async () => {
      const answer = await callApi(`/api/sheets/${sheetId}`, { method: 'PATCH', body: { ...settings, items: toRequest(items) } });
      setSave(answer.ok ? { state: 'saved' } : { state: 'error', message: answer.message });
    }, 800);
    return () => clearTimeout(timer);
  }, [settings, items, sheetId]);

  const change = <K extends keyof BuilderSettings>(key: K, value: BuilderSettings[K]) => setSettings((current) => ({ ...current, [key]: value }));
  const describe = (item: BuilderItem) => (item.kind === 'heading' ? `heading ${item.text}` : `swatch ${item.hex}`);

  function move(from: number, to: number) {
    if (to < 0 || to >= items.length || from === to) return;
    const next = [...items];
    const [moved] = next.splice(from, 1);
    next.splice(to, 0, moved);
    setItems(next);
    setAnnouncement(`Moved ${describe(moved)} to position ${to + 1} of ${next.length}.`);
    requestAnimationFrame(() => document.getElementById(`sheet-item-${moved.key}`)?.focus());
  }
  const update = (key: string, patch: Partial<Annotation> | { text: string }) =>
    setItems((current) => current.map((item) => (item.key === key ? ({ ...item, ...patch } as BuilderItem) : item)));
  const remove = (index: number) => {
    setAnnouncement(`Removed ${describe(items[index])}.`);
    setItems((current) => current.filter((_, at) => at !== index));
  };
  const add = (pick: Pick) => {
    setItems((current) => [
      ...current,
      { key: newKey(), kind: 'swatch', itemId: 0, swatchId: pick.swatchId, hex: pick.hex, label: pick.couponTitle, available: true, ...noAnnotation },
    ]);
    setAnnouncement(`Added swatch ${pick.hex}.`);
  };
  const addHeading = () => setItems((current) => [...current, { key: newKey(), kind: 'heading', text: 'New group' }]);

  function onKey(event: KeyboardEvent, index: number) {
    if (event.target !== event.currentTarget) return;
    const moves: Record<string, number> = { ArrowLeft: -1, ArrowUp: -1, ArrowRight: 1, ArrowDown: 1 };
    if (event.key in moves) {
      event.preventDefault();
      move(index, index + moves[event.key]);
    } else if (event.key === 'Delete') remove(index);
  }
  const onDrop = (event: DragEvent, index: number) => {
    event.preventDefault();
    if (dragFrom.current !== null) move(dragFrom.current, index);
    dragFrom.current = null;
  };

  async function search() {
    setSearchMessage('Searching…');
    const answer = await callApi<{ hits: { swatchId: number; hex: string; coupon: { title: string }; deltaE00: number }[] }>(
      `/api/swatches/search?hex=${encodeURIComponent(searchHex)}&maxDeltaE=10&limit=40`,
    );
    if (!answer.ok) return setSearchMessage(answer.message);
    setFound(answer.body.hits.map((hit) => ({ swatchId: hit.swatchId, hex: hit.hex, couponTitle: `${hit.coupon.title} (ΔE00 ${hit.deltaE00.toFixed(1)})` })));
    setSearchMessage(`${answer.body.hits.length} swatches within ΔE00 10.`);
  }

  async function filterLibrary(event: FormEvent) {
    event.preventDefault();
    setLibraryMessage('Searching…');
    const answer = await callApi<{ coupons: LibraryCouponAnswer[]; total: number }>(`/api/coupons?${libraryPickQuery(filters)}`);
    if (!answer.ok) return setLibraryMessage(answer.message);
    const picks = libraryPicks(answer.body.coupons);
    setLibraryFound(picks);
    setLibraryMessage(`${picks.length} swatches from ${answer.body.coupons.length} of ${answer.body.total} coupons.`);
  }
  const setFilter = (key: keyof LibraryPickFilters, value: string) => setFilters((current) => ({ ...current, [key]: value }));

  async function publish(next: SheetStatus) {
    setSave({ state: 'saving' });
    const answer = await callApi(`/api/sheets/${sheetId}`, { method: 'PATCH', body: { ...settings, items: toRequest(items), status: next } });
    if (answer.ok) setStatus(next);
    setSave(answer.ok ? { state: 'saved' } : { state: 'error', message: answer.message });
  }

  const picks = source === 'class' ? fromClass : source === 'own' ? own : source === 'library' ? libraryFound : found;
  const alloySelect = (key: 'alloy' | 'pairA' | 'pairB', label: string) => (
    <div className="field">
      <label htmlFor={`sheet-library-${key}`}>{label}</label>
      <select id={`sheet-library-${key}`} className="input" value={filters[key]} onChange={(event) => setFilter(key, event.target.value)}>
        <option value="">Any</option>
        {alloyCatalogue.map((alloy) => (
          <option key={alloy.slug} value={alloy.slug}>
            {alloy.name}
          </option>
        ))}
      </select>
    </div>
  );
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
      <div className="space-y-4">
        <p role="status" className={save.state === 'error' ? 'alert alert-error' : 'text-sm text-ash-600'}>
          {save.state === 'saving'
            ? 'Saving…'
            : save.state === 'saved'
              ? `Saved · ${status === 'published' ? 'published' : 'draft'}`
              : `Not saved: ${save.message}`}
        </p>
        {note && <p className="alert alert-caution">{note} Remove them below, or ask the students to share them again.</p>}
        <div className="card grid gap-3 sm:grid-cols-2">
          <div className="field sm:col-span-2">
            <label htmlFor="sheet-title">Title</label>
            <input id="sheet-title" className="input" value={settings.title} maxLength={160} onChange={(event) => change('title', event.target.value)} />
          </div>
          <div className="field sm:col-span-2">
            <label htmlFor="sheet-intro">Introduction</label>
            <textarea
              id="sheet-intro"
              className="input min-h-20"
              value={settings.intro}
              maxLength={600}
              onChange={(event) => change('intro', event.target.value)}
            />
          </div>
          <div className="field">
            <label htmlFor="sheet-class">Class</label>
            <select
              id="sheet-class"
              className="input"
              value={settings.classId ?? ''}
              onChange={(event) => change('classId', event.target.value ? Number(event.target.value) : null)}
            >
              <option value="">No class</option>
              {classes.map((option) => (
                <option key={option.id} value={option.id}>
                  {option.name}
                </option>
              ))}
            </select>
          </div>
          <div className="field">
            <label htmlFor="sheet-units">Temperatures in</label>
            <select id="sheet-units" className="input" value={settings.units} onChange={(event) => change('units', event.target.value as SheetUnits)}>
              <option value="c">°C</option>
              <option value="f">°F</option>
            </select>
          </div>
          <div className="field">
            <label htmlFor="sheet-size">Page size</label>
            <select id="sheet-size" className="input" value={settings.pageSize} onChange={(event) => change('pageSize', event.target.value as PageSizeName)}>
              <option value="a4">A4</option>
              <option value="letter">Letter</option>
            </select>
          </div>
          <div className="field">
            <label htmlFor="sheet-orientation">Orientation</label>
            <select
              id="sheet-orientation"
              className="input"
              value={settings.orientation}
              onChange={(event) => change('orientation', event.target.value as Orientation)}
            >
              <option value="portrait">Portrait</option>
              <option value="landscape">Landscape</option>
            </select>
          </div>
          <label className="flex items-center gap-2 sm:col-span-2">
            <input type="checkbox" checked={settings.showPrediction} onChange={(event) => change('showPrediction', event.target.checked)} />
            Show the heat planner’s predicted colour beside each measured swatch
          </label>
        </div>

        <h2 id="arrange-heading">Arrange</h2>
        <p className="text-sm text-ash-600">
          Drag to reorder, or focus an entry and use the arrow keys (Delete removes it).{' '}
          <button type="button" className="btn min-h-9 px-3 py-1" onClick={addHeading}>
            Add a heading
          </button>
        </p>
        <p aria-live="polite" className="sr-only">
          {announcement}
        </p>
        <ol aria-labelledby="arrange-heading" className="grid grid-cols-1 gap-3 sm:grid-cols-2 xl:grid-cols-3">
          {items.map((item, index) => (
            <li
              key={item.key}
              id={`sheet-item-${item.key}`}
              tabIndex={0}
              draggable
              aria-label={`${describe(item)}, position ${index + 1} of ${items.length}`}
              onKeyDown={(event) => onKey(event, index)}
              onDragStart={() => (dragFrom.current = index)}
              onDragOver={(event) => event.preventDefault()}
              onDrop={(event) => onDrop(event, index)}
              className={`card space-y-2 p-3 focus:outline-2 focus:outline-oxide-600 ${item.kind === 'heading' ? 'col-span-full' : ''}`}
            >
              {item.kind === 'heading' ? (
                <input
                  aria-label="Heading"
                  className="input font-serif font-semibold"
                  value={item.text}
                  maxLength={160}
                  onChange={(event) => update(item.key, { text: event.target.value })}
                />
              ) : (
                <>
                  <div className="flex items-center gap-2">
                    <span className="h-10 w-10 shrink-0 rounded border border-ash-300" style={{ background: item.hex }} aria-hidden="true" />
                    <span className="min-w-0 text-sm">
                      <span className="tabular block font-mono">{item.hex.toUpperCase()}</span>
                      <span className="block truncate text-ash-600" title={item.available ? item.label : undefined}>
                        {item.available ? item.label : 'No longer shared or deleted'}
                      </span>
                    </span>
                  </div>
                  <textarea
                    aria-label={`Caption for ${item.hex}`}
                    placeholder="Caption"
                    rows={2}
                    className="input min-h-0 text-sm"
                    value={item.caption}
                    maxLength={280}
                    onChange={(event) => update(item.key, { caption: event.target.value })}
                  />
                  <fieldset className="grid grid-cols-2 text-xs">
                    <legend className="sr-only">Hide on the sheet</legend>
                    {(
                      [
                        ['hideTemperature', 'Hide temp.'],
                        ['hideHold', 'Hide hold'],
                        ['hideProcess', 'Hide process'],
                        ['hideAlloy', 'Hide alloy'],
                      ] as const
                    ).map(([key, label]) => (
                      <label key={key} className="flex items-center gap-1">
                        <input type="checkbox" checked={item[key]} onChange={(event) => update(item.key, { [key]: event.target.checked })} />
                        {label}
                      </label>
                    ))}
                  </fieldset>
                </>
              )}
              <div className="flex flex-wrap gap-1 text-xs">
                <button
                  type="button"
                  className="btn min-h-8 px-2 py-0.5"
                  disabled={index === 0}
                  onClick={() => move(index, index - 1)}
                  aria-label={`Move ${describe(item)} earlier`}
                >
                  ←
                </button>
                <button
                  type="button"
                  className="btn min-h-8 px-2 py-0.5"
                  disabled={index === items.length - 1}
                  onClick={() => move(index, index + 1)}
                  aria-label={`Move ${describe(item)} later`}
                >
                  →
                </button>
                <button type="button" className="btn min-h-8 px-2 py-0.5" onClick={() => remove(index)} aria-label={`Remove ${describe(item)}`}>
                  Remove
                </button>
              </div>
            </li>
          ))}
        </ol>
        {items.length === 0 && <p className="text-ash-600">No swatches yet: add some from the list.</p>}

        <div className="card flex flex-wrap items-end gap-3">
          <div className="field">
            <label htmlFor="sheet-audience">Who sees it when published</label>
            <select
              id="sheet-audience"
              className="input"
              value={settings.audience}
              onChange={(event) => change('audience', event.target.value as SheetAudience)}
            >
              <option value="class">The class only</option>
              <option value="public">Everyone</option>
            </select>
          </div>
          {status === 'draft' ? (
            <button type="button" className="btn btn-primary" onClick={() => publish('published')}>
              Publish
            </button>
          ) : (
            <button type="button" className="btn" onClick={() => publish('draft')}>
              Withdraw to draft
            </button>
          )}
          <a className="btn" href={`/sheets/${sheetId}`}>
            View the sheet
          </a>
        </div>
      </div>

      <aside className="space-y-3 lg:sticky lg:top-4 lg:self-start" aria-labelledby="pick-heading">
        <h2 id="pick-heading">Add swatches</h2>
        <div className="flex flex-wrap gap-1" role="group" aria-label="Where from">
          {(
            [
              ['class', 'The class'],
              ['own', 'My coupons'],
              ['library', 'Library'],
              ['search', 'Library by colour'],
            ] as const
          ).map(([key, label]) => (
            <button
              key={key}
              type="button"
              aria-pressed={source === key}
              className={`btn min-h-9 px-3 py-1 ${source === key ? 'btn-primary' : ''}`}
              onClick={() => setSource(key)}
            >
              {label}
            </button>
          ))}
        </div>
        {source === 'library' && (
          <form className="grid grid-cols-2 gap-2" aria-label="Filter the library" onSubmit={filterLibrary}>
            <div className="col-span-2">{alloySelect('alloy', 'Alloy')}</div>
            {alloySelect('pairA', 'Pair: first alloy')}
            {alloySelect('pairB', 'Pair: second alloy')}
            <div className="field col-span-2">
              <label htmlFor="sheet-library-process">Process</label>
              <select id="sheet-library-process" className="input" value={filters.process} onChange={(event) => setFilter('process', event.target.value)}>
                <option value="">Any</option>
                {Object.entries(labels.process).map(([value, label]) => (
                  <option key={value} value={value}>
                    {label}
                  </option>
                ))}
              </select>
            </div>
            <div className="field">
              <label htmlFor="sheet-library-min">From °C</label>
              <input
                id="sheet-library-min"
                className="input"
                inputMode="numeric"
                value={filters.tempMin}
                onChange={(event) => setFilter('tempMin', event.target.value)}
              />
            </div>
            <div className="field">
              <label htmlFor="sheet-library-max">To °C</label>
              <input
                id="sheet-library-max"
                className="input"
                inputMode="numeric"
                value={filters.tempMax}
                onChange={(event) => setFilter('tempMax', event.target.value)}
              />
            </div>
            <div className="col-span-2 flex flex-wrap items-center gap-2">
              <button type="submit" className="btn">
                Show swatches
              </button>
              <span role="status" className="text-sm text-ash-600">
                {libraryMessage}
              </span>
            </div>
          </form>
        )}
        {source === 'search' && (
          <div className="flex items-end gap-2">
            <div className="field">
              <label htmlFor="sheet-search">Colour</label>
              <input id="sheet-search" type="color" className="h-10 w-16" value={searchHex} onChange={(event) => setSearchHex(event.target.value)} />
            </div>
            <button type="button" className="btn" onClick={search}>
              Find swatches
            </button>
            <span role="status" className="text-sm text-ash-600">
              {searchMessage}
            </span>
          </div>
        )}
        {source === 'class' && !settings.classId && <p className="text-sm text-ash-600">Choose the sheet’s class to see what its students shared.</p>}
        <ul className="grid max-h-[32rem] grid-cols-1 gap-2 overflow-y-auto sm:grid-cols-2 lg:max-h-[calc(100vh-14rem)] lg:grid-cols-1">
          {picks.map((pick) => (
            <li key={pick.swatchId}>
              <button
                type="button"
                className="flex w-full items-center gap-2 rounded border border-ash-200 p-1 text-left text-xs hover:bg-ash-50"
                onClick={() => add(pick)}
                aria-label={`Add ${pick.hex} from ${pick.couponTitle}`}
              >
                <span className="h-8 w-8 shrink-0 rounded" style={{ background: pick.hex }} aria-hidden="true" />
                <span className="line-clamp-2 min-w-0">{pick.couponTitle}</span>
              </button>
            </li>
          ))}
        </ul>
        {picks.length === 0 && source !== 'search' && source !== 'library' && <p className="text-sm text-ash-600">Nothing here yet.</p>}
      </aside>
    </div>
  );
}
