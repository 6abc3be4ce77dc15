import { useEffect, useMemo, useState, type SubmitEvent, type ReactNode } from 'react';
import {
  MAX_LAYERS,
  atmospheres,
  coolings,
  couponInputSchema,
  labels,
  processes,
  surfacePreparations,
  temperatureMethods,
  visibilities,
  type CouponInput,
} from '../../lib/coupons';
import { emptyForm, fieldOf, formFromCoupon, payloadOf, switchUnit, type FormState } from './coupon-form-state';

interface AlloyOption {
  slug: string;
  name: string;
  family: string;
}

interface Props {
  alloys: AlloyOption[];
  /** Editing an existing coupon; absent when logging a new one. */
  couponId?: number;
  initial?: CouponInput;
  caution: string;
}

type Errors = Record<string, string>;

const draftKey = (couponId?: number) => `oxbloom:coupon-draft:${couponId ?? 'new'}`;

export default function CouponForm({ alloys, couponId, initial, caution }: Props) {
  const [form, setForm] = useState<FormState>(() => (initial ? formFromCoupon(initial) : emptyForm));
  const [errors, setErrors] = useState<Errors>({});
  const [status, setStatus] = useState<'idle' | 'saving'>('idle');
  const [notice, setNotice] = useState<string>();
  const [restored, setRestored] = useState(false);

  useEffect(() => {
    const saved = localStorage.getItem(draftKey(couponId));
    if (!saved) return;
    try {
      setForm({ ...emptyForm, ...(JSON.parse(saved) as FormState) });
      setRestored(true);
    } catch {
      localStorage.removeItem(draftKey(couponId));
    }
  }, [couponId]);

  const update = (changes: Partial<FormState>) =>
    setForm((current) => {
      const next = { ...current, ...changes };
      localStorage.setItem(draftKey(couponId), JSON.stringify(next));
      return next;
    });

  const discardDraft = () => {
    localStorage.removeItem(draftKey(couponId));
    setForm(initial ? formFromCoupon(initial) : emptyForm);
    setRestored(false);
    setErrors({});
  };

  const families = useMemo(() => [...new Set(alloys.map((alloy) => alloy.family))], [alloys]);
  const anodize = form.process === 'anodize';

  async function submit(event: SubmitEvent) {
    event.preventDefault();
    setNotice(undefined);
    const payload = payloadOf(form);
    const checked = couponInputSchema.safeParse(payload);
    if (!checked.success) {
      const found: Errors = {};
      for (const issue of checked.error.issues) found[fieldOf(issue.path)] ??= issue.message;
      setErrors(found);
      setNotice('Some fields need another look.');
      return;
    }
    setErrors({});
    setStatus('saving');
    try {
      const response = await fetch(couponId ? `/api/coupons/${couponId}` : '/api/coupons', {
        method: couponId ? 'PATCH' : 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify(payload),
      });
      const body = (await response.json().catch(() => ({}))) as { id?: number; error?: string; field?: string };
      if (!response.ok) {
        if (body.field) setErrors({ [fieldOf(body.field.split('.'))]: body.error ?? 'Check this field.' });
        setNotice(response.status === 401 ? 'Your session has ended: sign in again in another tab, then save — your draft is kept.' : body.error ?? 'Saving did not work. Your draft is kept.');
        return;
      }
      localStorage.removeItem(draftKey(couponId));
      window.location.assign(`/coupons/${body.id ?? couponId}${couponId ? '' : '?added=1'}`);
    } catch {
      setNotice('No connection to Oxbloom. Your draft is kept; try again.');
    } finally {
      setStatus('idle');
    }
  }

  const setLayer = (index: number, slug: string) => update({ layers: form.layers.map((layer, at) => (at === index ? slug : layer)) });

  return (
    <form onSubmit={submit} noValidate className="space-y-6" aria-describedby="coupon-caution">
      {restored && (
        <div className="alert flex flex-wrap items-center justify-between gap-2" role="status">
          <span>Your unsaved draft is back.</span>
          <button type="button" className="btn" onClick={discardDraft}>
            Start over
          </button>
        </div>
      )}

      <Section title="The coupon">
        <TextField label="Title" name="title" value={form.title} error={errors.title} onChange={(title) => update({ title })} hint="What you tried, in a few words." />
        <fieldset className="space-y-3">
          <legend className="field-label">Layers</legend>
          <p className="field-hint">One alloy for a plain coupon; two or more for a laminate, in order.</p>
          {form.layers.map((slug, index) => (
            <div key={index} className="flex items-end gap-2">
              <div className="field flex-1">
                <label htmlFor={`layer-${index}`}>Layer {index + 1} alloy</label>
                <select id={`layer-${index}`} className="input" value={slug} onChange={(event) => setLayer(index, event.target.value)} aria-invalid={errors.layers && !slug ? true : undefined}>
                  <option value="">Choose an alloy…</option>
                  {families.map((family) => (
                    <optgroup key={family} label={family.replace('-', ' ')}>
                      {alloys
                        .filter((alloy) => alloy.family === family)
                        .map((alloy) => (
                          <option key={alloy.slug} value={alloy.slug}>
                            {alloy.name}
                          </option>
                        ))}
                    </optgroup>
                  ))}
                </select>
              </div>
              {form.layers.length > 1 && (
                <button type="button" className="btn" onClick={() => update({ layers: form.layers.filter((_, at) => at !== index) })} aria-label={`Remove layer ${index + 1}`}>
                  Remove
                </button>
              )}
            </div>
          ))}
          {errors.layers && <p className="field-error">{errors.layers}</p>}
          {form.layers.length < MAX_LAYERS && (
            <button type="button" className="btn" onClick={() => update({ layers: [...form.layers, ''] })}>
              Add a layer
            </button>
          )}
        </fieldset>
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField label="Surface preparation" name="surfacePrep" value={form.surfacePrep} options={surfacePreparations} names={labels.surfacePrep} error={errors.surfacePrep} onChange={(surfacePrep) => update({ surfacePrep })} />
          {form.surfacePrep === 'ground' && (
            <TextField label="Grit" name="surfaceGrit" inputMode="numeric" value={form.surfaceGrit} error={errors.surfaceGrit} onChange={(surfaceGrit) => update({ surfaceGrit })} hint="Last grit, e.g. 400." />
          )}
        </div>
      </Section>

      <Section title="The heat">
        <p id="coupon-caution" className="alert alert-caution text-sm">
          {caution} <a href="/safety">Safety notes</a>.
        </p>
        <SelectField label="Process" name="process" value={form.process} options={processes} names={labels.process} error={errors.process} onChange={(process) => update({ process })} />
        {anodize ? (
          <TextField label="Voltage (V)" name="volts" inputMode="decimal" value={form.volts} error={errors.volts} onChange={(volts) => update({ volts })} />
        ) : (
          <>
            <div className="grid gap-4 sm:grid-cols-2">
              <div className="field">
                <label htmlFor="temperature">Temperature (°{form.temperatureUnit})</label>
                <div className="flex gap-2">
                  <input id="temperature" className="input" inputMode="decimal" value={form.temperature} aria-invalid={errors.temperature ? true : undefined} aria-describedby={errors.temperature ? 'temperature-error' : undefined} onChange={(event) => update({ temperature: event.target.value })} />
                  <div role="group" aria-label="Temperature unit" className="flex shrink-0">
                    {(['C', 'F'] as const).map((unit) => (
                      <button key={unit} type="button" className={`btn px-3 ${form.temperatureUnit === unit ? 'btn-primary' : ''}`} aria-pressed={form.temperatureUnit === unit} onClick={() => update(switchUnit(form, unit))}>
                        °{unit}
                      </button>
                    ))}
                  </div>
                </div>
                {errors.temperature && <p id="temperature-error" className="field-error">{errors.temperature}</p>}
              </div>
              <SelectField label="Measured by" name="temperatureMethod" value={form.temperatureMethod} options={temperatureMethods} names={labels.temperatureMethod} error={errors.temperatureMethod} onChange={(temperatureMethod) => update({ temperatureMethod })} />
              <TextField label="Hold time (minutes)" name="holdMinutes" inputMode="decimal" value={form.holdMinutes} error={errors.holdMinutes} onChange={(holdMinutes) => update({ holdMinutes })} hint="Time at temperature." />
              <SelectField label="Cooling" name="cooling" value={form.cooling} options={coolings} names={labels.cooling} error={errors.cooling} onChange={(cooling) => update({ cooling })} />
            </div>
          </>
        )}
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField label="Atmosphere" name="atmosphere" value={form.atmosphere} options={atmospheres} names={labels.atmosphere} error={errors.atmosphere} onChange={(atmosphere) => update({ atmosphere })} />
          {form.atmosphere === 'argon' && (
            <TextField label="Argon flow (L/min)" name="argonFlowLpm" inputMode="decimal" value={form.argonFlowLpm} error={errors.argonFlowLpm} onChange={(argonFlowLpm) => update({ argonFlowLpm })} />
          )}
          {(form.atmosphere === 'other' || anodize) && (
            <TextField label={anodize ? 'Electrolyte' : 'Atmosphere details'} name="atmosphereNote" value={form.atmosphereNote} error={errors.atmosphereNote} onChange={(atmosphereNote) => update({ atmosphereNote })} required={false} />
          )}
        </div>
        <div className="field">
          <label htmlFor="notes">Notes</label>
          <textarea id="notes" className="input min-h-28" value={form.notes} onChange={(event) => update({ notes: event.target.value })} aria-invalid={errors.notes ? true : undefined} />
          {errors.notes && <p className="field-error">{errors.notes}</p>}
        </div>
      </Section>

      <Section title="Who can see it">
        <fieldset className="flex flex-wrap gap-4">
          <legend className="sr-only">Visibility</legend>
          {visibilities.map((visibility) => (
            <label key={visibility} className="flex items-center gap-2">
              <input type="radio" name="visibility" value={visibility} checked={form.visibility === visibility} onChange={() => update({ visibility })} />
              {labels.visibility[visibility]}
            </label>
          ))}
        </fieldset>
        {errors.visibility && <p className="field-error">{errors.visibility}</p>}
      </Section>

      {notice && (
        <p className="alert alert-error" role="alert">
          {notice}
        </p>
      )}
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className="btn btn-primary" disabled={status === 'saving'}>
          {status === 'saving' ? 'Saving…' : couponId ? 'Save changes' : 'Save coupon and add photos'}
        </button>
        <span className="text-sm text-ash-600">A draft is kept on this device while you type.</span>
      </div>
    </form>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="card space-y-4">
      <h2 className="text-xl">{title}</h2>
      {children}
    </section>
  );
}

interface TextFieldProps {
  label: string;
  name: string;
  value: string;
  error?: string;
  hint?: string;
  required?: boolean;
  inputMode?: 'numeric' | 'decimal' | 'text';
  onChange: (value: string) => void;
}

function TextField({ label, name, value, error, hint, inputMode, onChange }: TextFieldProps) {
  const describedBy = [hint && `${name}-hint`, error && `${name}-error`].filter(Boolean).join(' ') || undefined;
  return (
    <div className="field">
      <label htmlFor={name}>{label}</label>
      <input id={name} name={name} className="input" inputMode={inputMode} value={value} aria-invalid={error ? true : undefined} aria-describedby={describedBy} onChange={(event) => onChange(event.target.value)} />
      {hint && (
        <p id={`${name}-hint`} className="field-hint">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${name}-error`} className="field-error">
          {error}
        </p>
      )}
    </div>
  );
}

interface SelectFieldProps<T extends string> {
  label: string;
  name: string;
  value: string;
  options: readonly T[];
  names: Record<T, string>;
  error?: string;
  onChange: (value: T) => void;
}

function SelectField<T extends string>({ label, name, value, options, names, error, onChange }: SelectFieldProps<T>) {
  return (
    <div className="field">
      <label htmlFor={name}>{label}</label>
      <select id={name} name={name} className="input" value={value} aria-invalid={error ? true : undefined} onChange={(event) => onChange(event.target.value as T)}>
        <option value="">Choose…</option>
        {options.map((option) => (
          <option key={option} value={option}>
            {names[option]}
          </option>
        ))}
      </select>
      {error && <p className="field-error">{error}</p>}
    </div>
  );
}
