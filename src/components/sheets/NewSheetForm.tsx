import { useState, type SyntheticEvent } from 'react';
import { callApi } from '~/components/api-client';

/** Starts a draft sheet and opens its builder. */
export default function NewSheetForm({ classes, initialClassId }: { classes: { id: number; name: string }[]; initialClassId: number | null }) {
  const [title, setTitle] = useState('');
  const [classId, setClassId] = useState<number | null>(initialClassId);
  const [error, setError] = useState('');
  async function submit(event: SyntheticEvent) {
    event.preventDefault();
    const answer = await callApi<{ id: number }>('/api/sheets', { method: 'POST', body: { title, classId, audience: classId ? 'class' : 'public' } });
    if (answer.ok) window.location.assign(`/sheets/${answer.body.id}/edit`);
    else setError(answer.message);
  }
  return (
    <form className="card space-y-3" onSubmit={submit} noValidate>
      <div className="field">
        <label htmlFor="new-sheet-title">Title</label>
        <input
          id="new-sheet-title"
          className="input"
          required
          maxLength={160}
          value={title}
          onChange={(event) => setTitle(event.target.value)}
          aria-invalid={error ? true : undefined}
        />
      </div>
      <div className="field">
        <label htmlFor="new-sheet-class">Class</label>
        <select
          id="new-sheet-class"
          className="input"
          value={classId ?? ''}
          onChange={(event) => setClassId(event.target.value ? Number(event.target.value) : null)}
        >
          <option value="">No class (a sheet for everyone)</option>
          {classes.map((option) => (
            <option key={option.id} value={option.id}>
              {option.name}
            </option>
          ))}
        </select>
      </div>
      {error && (
        <p className="field-error" role="alert">
          {error}
        </p>
      )}
      <button type="submit" className="btn btn-primary">
        Start the sheet
      </button>
    </form>
  );
}
