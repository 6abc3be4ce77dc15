import { useState } from 'react';
import { GREY_CARD_REFLECTANCE, type PhotoLayer, type PhotoView } from '~/lib/photos';
import { removePhoto, saveRegions, StepFailed } from './photo-api';
import RegionEditor, { GREY, marksOf, reflectanceOf, regionsOf, type Marks } from './RegionEditor';
import SwatchGroups from './SwatchGroups';

interface Props {
  photo: PhotoView;
  layers: PhotoLayer[];
  editable: boolean;
  onChanged: (photo: PhotoView) => void;
  onDeleted: (photoId: number) => void;
}

const facts = (photo: PhotoView) =>
  [photo.takenAt && `Taken ${photo.takenAt.slice(0, 16).replace('T', ' ')}`, photo.camera, photo.lens, photo.exposure].filter(Boolean).join(' · ');

/** One photo: its regions (editable by the owner), its swatches per layer, and what the camera recorded. */
export default function PhotoCard({ photo, layers, editable, onChanged, onDeleted }: Props) {
  const [marks, setMarks] = useState<Marks>(() => marksOf(photo));
  const [reflectance, setReflectance] = useState(() => reflectanceOf(photo));
  const [busy, setBusy] = useState<'saving' | 'deleting' | null>(null);
  const [message, setMessage] = useState<{ text: string; error?: boolean }>();
  const saved = JSON.stringify(regionsOf(marksOf(photo), layers, reflectanceOf(photo)));
  const changed = JSON.stringify(regionsOf(marks, layers, reflectance)) !== saved;
  const undo = () => {
    setMarks(marksOf(photo));
    setReflectance(reflectanceOf(photo));
  };

  async function save() {
    setBusy('saving');
    setMessage({ text: 'Measuring the regions…' });
    try {
      const updated = await saveRegions(photo.id, regionsOf(marks, layers, reflectance));
      setMarks(marksOf(updated));
      setReflectance(reflectanceOf(updated));
      onChanged(updated);
      setMessage({ text: 'Regions saved; swatches updated.' });
    } catch (error) {
      setMessage({ text: error instanceof StepFailed ? error.message : 'The regions were not saved. Try again.', error: true });
    } finally {
      setBusy(null);
    }
  }

  async function remove() {
    if (!window.confirm('Delete this photo and its swatches? This cannot be undone.')) return;
    setBusy('deleting');
    try {
      await removePhoto(photo.id);
      onDeleted(photo.id);
    } catch (error) {
      setMessage({ text: error instanceof StepFailed ? error.message : 'The photo was not deleted. Try again.', error: true });
      setBusy(null);
    }
  }

  return (
    <article
      className="grid gap-4 border-t border-ash-200 pt-4 first:border-t-0 first:pt-0 @4xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]"
      aria-label={`Photo ${photo.id}`}
    >
      <div className="space-y-2">
        <RegionEditor photo={photo} layers={layers} marks={marks} editable={editable && busy === null} onChange={setMarks} />
        <p className="text-xs text-ash-600">{[facts(photo), `${photo.width} × ${photo.height} px`].filter(Boolean).join(' · ')}</p>
      </div>
      <div className="space-y-3">
        {editable && (
          <div className="flex flex-wrap gap-2">
            <button type="button" className="btn btn-primary" disabled={!changed || busy !== null} onClick={save}>
              Save regions
            </button>
            <button type="button" className="btn" disabled={!changed || busy !== null} onClick={undo}>
              Undo changes
            </button>
            <button type="button" className="btn btn-danger" disabled={busy !== null} onClick={remove}>
              Delete photo
            </button>
          </div>
        )}
        {editable && marks[GREY] && (
          <div className="field">
            <label htmlFor={`grey-reflectance-${photo.id}`}>Grey card reflectance (%)</label>
            <input
              id={`grey-reflectance-${photo.id}`}
              className="input w-28"
              inputMode="decimal"
              placeholder={String(GREY_CARD_REFLECTANCE.standard)}
              value={reflectance}
              disabled={busy !== null}
              onChange={(event) => setReflectance(event.target.value)}
            />
            <p className="field-hint">
              Leave empty for a standard {GREY_CARD_REFLECTANCE.standard} % grey card (L* 50). The card sets the colour balance and the exposure, so the film is
              read at its true lightness.
            </p>
          </div>
        )}
        {message && (
          <p className={message.error ? 'field-error' : 'text-sm text-ash-700'} role={message.error ? 'alert' : 'status'}>
            {message.text}
          </p>
        )}
        <SwatchGroups photo={photo} layers={layers} />
      </div>
    </article>
  );
}
