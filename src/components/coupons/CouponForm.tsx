import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { useController, useWatch, type FieldPath } from 'react-hook-form';
import { MAX_LAYERS, atmospheres, coolings, labels, processes, surfacePreparations, temperatureMethods, visibilities, type CouponInput } from '~/lib/coupons';
import { callApi } from '~/components/api-client';
import { useRequestForm } from '~/components/request-form';
import { FieldError } from '~/components/ui/FieldError';
import { optionsOf, SelectField } from '~/components/ui/SelectField';
import { TextField } from '~/components/ui/TextField';
import { couponResolver, emptyForm, fieldOf, formFromCoupon, switchUnit, type FormState } from './coupon-form-state';

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
  /** Classes the person may share the coupon with, and those it is shared with now. */
  classes?: { id: number; name: string; term: string | null }[];
  sharedWith?: number[];
}

const draftKey = (couponId?: number) => `oxbloom:coupon-draft:${couponId ?? 'new'}`;

export default function CouponForm({ alloys, couponId, initial, caution, classes = [], sharedWith = [] }: Props) {
  const [classIds, setClassIds] = useState<number[]>(sharedWith);
  const { control, handleSubmit, reset, setValue, getValues, setError, watch, formState } = useRequestForm(
    initial ? formFromCoupon(initial) : emptyForm,
    couponResolver,
  );
  const [notice, setNotice] = useState<string>();
  const [restored, setRestored] = useState(false);
  const [process, atmosphere, surfacePrep, layers, temperatureUnit] = useWatch({
    control,
    name: ['process', 'atmosphere', 'surfacePrep', 'layers', 'temperatureUnit'],
  });
  const notes = useController({ control, name: 'notes' });
  const visibility = useController({ control, name: 'visibility' }).field;

  useEffect(() => {
    const saved = localStorage.getItem(draftKey(couponId));
    if (!saved) return;
    try {
      reset({ ...emptyForm, ...(JSON.parse(saved) as FormState) });
      // The draft lives in localStorage, which can only be read once the island runs in the browser.
      // eslint-disable-next-line react-hooks/set-state-in-effect
      setRestored(true);
    } catch {
      localStorage.removeItem(draftKey(couponId));
    }
  }, [couponId, reset]);

  // Each change (a reset names no field) keeps the draft on this device.
  useEffect(() => {
    const subscription = watch((values, { name }) => {
      if (name) localStorage.setItem(draftKey(couponId), JSON.stringify(values));
    });
    return () => subscription.unsubscribe();
  }, [couponId, watch]);

  const discardDraft = () => {
    localStorage.removeItem(draftKey(couponId));
    reset(initial ? formFromCoupon(initial) : emptyForm);
    setRestored(false);
  };

  const alloyGroups = useMemo(
    () =>
      [...new Set(alloys.map((alloy) => alloy.family))].map((family) => ({
        label: family.replace('-', ' '),
        options: alloys.filter((alloy) => alloy.family === family).map((alloy) => ({ value: alloy.slug, label: alloy.name })),
      })),
    [alloys],
  );
  const anodize = process === 'anodize';
  const layersError = formState.errors.layers?.message;

  const save = handleSubmit(
    async (payload) => {
      const answer = await callApi<{ id?: number }>(couponId ? `/api/coupons/${couponId}` : '/api/coupons', {
        method: couponId ? 'PATCH' : 'POST',
        body: payload,
      });
      if (!answer.ok) {
        if (answer.field) setError(fieldOf(answer.field.split('.')) as FieldPath<FormState>, { message: answer.message });
        setNotice(
          answer.status === 401
            ? 'Your session has ended: sign in again in another tab, then save — your draft is kept.'
            : answer.status === 0
              ? 'No connection to Oxbloom. Your draft is kept; try again.'
              : answer.message,
        );
        return;
      }
      localStorage.removeItem(draftKey(couponId));
      const savedId = answer.body.id ?? couponId;
      // Class sharing is its own route (the class checks membership); a refusal leaves the coupon saved.
      for (const cls of classes) {
        const wanted = classIds.includes(cls.id);
        if (wanted !== sharedWith.includes(cls.id)) await callApi(`/api/classes/${cls.id}/coupons/${savedId}`, { method: wanted ? 'PUT' : 'DELETE' });
      }
      window.location.assign(`/coupons/${answer.body.id ?? couponId}${couponId ? '' : '?added=1'}`);
    },
    () => setNotice('Some fields need another look.'),
  );

  const switchTo = (unit: 'C' | 'F') => {
    const switched = switchUnit(getValues(), unit);
    setValue('temperatureUnit', switched.temperatureUnit);
    setValue('temperature', switched.temperature);
  };

  return (
    <form
      onSubmit={(event) => {
        setNotice(undefined);
        void save(event);
      }}
      noValidate
      className="space-y-6"
      aria-describedby="coupon-caution"
    >
      {restored && (
        <div className="alert flex flex-wrap items-center justify-between gap-2" role="status">
          <span>Your unsaved draft is back.</span>
          <button type="button" className="btn" onClick={discardDraft}>
            Start over
          </button>
        </div>
      )}

      <Section title="The coupon">
        <TextField control={control} name="title" label="Title" hint="What you tried, in a few words." />
        <fieldset className="space-y-3">
          <legend className="field-label">Layers</legend>
          <p className="field-hint">One alloy for a plain coupon; two or more for a laminate, in order.</p>
          {layers.map((slug, index) => (
            <div key={index} className="flex items-end gap-2">
              <div className="flex-1">
                <SelectField
                  control={control}
                  name={`layers.${index}`}
                  id={`layer-${index}`}
                  label={`Layer ${index + 1} alloy`}
                  placeholder="Choose an alloy…"
                  groups={alloyGroups}
                  aria-invalid={layersError && !slug ? true : undefined}
                  aria-describedby={layersError && !slug ? 'layers-error' : undefined}
                />
              </div>
              {layers.length > 1 && (
                <button
                  type="button"
                  className="btn"
                  onClick={() =>
                    setValue(
                      'layers',
                      layers.filter((_, at) => at !== index),
                    )
                  }
                  aria-label={`Remove layer ${index + 1}`}
                >
                  Remove
                </button>
              )}
            </div>
          ))}
          <FieldError id="layers-error" message={layersError} />
          {layers.length < MAX_LAYERS && (
            <button type="button" className="btn" onClick={() => setValue('layers', [...layers, ''])}>
              Add a layer
            </button>
          )}
        </fieldset>
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            control={control}
            name="surfacePrep"
            label="Surface preparation"
            placeholder="Choose…"
            options={optionsOf(surfacePreparations, labels.surfacePrep)}
          />
          {surfacePrep === 'ground' && <TextField control={control} name="surfaceGrit" label="Grit" inputMode="numeric" hint="Last grit, e.g. 400." />}
        </div>
      </Section>

      <Section title="The heat">
        <p id="coupon-caution" className="alert alert-caution text-sm">
          {caution} <a href="/safety">Safety notes</a>.
        </p>
        <SelectField control={control} name="process" label="Process" placeholder="Choose…" options={optionsOf(processes, labels.process)} />
        {anodize ? (
          <TextField control={control} name="volts" label="Voltage (V)" inputMode="decimal" />
        ) : (
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField
              control={control}
              name="temperature"
              label={`Temperature (°${temperatureUnit})`}
              inputMode="decimal"
              unit={
                <div role="group" aria-label="Temperature unit" className="flex shrink-0">
                  {(['C', 'F'] as const).map((unit) => (
                    <button
                      key={unit}
                      type="button"
                      className={`btn px-3 ${temperatureUnit === unit ? 'btn-primary' : ''}`}
                      aria-pressed={temperatureUnit === unit}
                      onClick={() => switchTo(unit)}
                    >
                      °{unit}
                    </button>
                  ))}
                </div>
              }
            />
            <SelectField
              control={control}
              name="temperatureMethod"
              label="Measured by"
              placeholder="Choose…"
              options={optionsOf(temperatureMethods, labels.temperatureMethod)}
            />
            <TextField control={control} name="holdMinutes" label="Hold time (minutes)" inputMode="decimal" hint="Time at temperature." />
            <SelectField control={control} name="cooling" label="Cooling" placeholder="Choose…" options={optionsOf(coolings, labels.cooling)} />
          </div>
        )}
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField control={control} name="atmosphere" label="Atmosphere" placeholder="Choose…" options={optionsOf(atmospheres, labels.atmosphere)} />
          {atmosphere === 'argon' && <TextField control={control} name="argonFlowLpm" label="Argon flow (L/min)" inputMode="decimal" />}
          {(atmosphere === 'other' || anodize) && <TextField control={control} name="atmosphereNote" label={anodize ? 'Electrolyte' : 'Atmosphere details'} />}
        </div>
        <div className="field">
          <label htmlFor="notes">Notes</label>
          <textarea
            id="notes"
            className="input min-h-28"
            {...notes.field}
            aria-invalid={notes.fieldState.error ? true : undefined}
            aria-describedby={notes.fieldState.error ? 'notes-error' : undefined}
          />
          <FieldError id="notes-error" message={notes.fieldState.error?.message} />
        </div>
      </Section>

      <Section title="Who can see it">
        <fieldset className="flex flex-wrap gap-4">
          <legend className="sr-only">Visibility</legend>
          {visibilities.map((choice) => (
            <label key={choice} className="flex items-center gap-2">
              <input type="radio" name="visibility" value={choice} checked={visibility.value === choice} onChange={() => visibility.onChange(choice)} />
              {labels.visibility[choice]}
            </label>
          ))}
        </fieldset>
        <FieldError id="visibility-error" message={formState.errors.visibility?.message} />
        {classes.length > 0 && (
          <fieldset className="space-y-1">
            <legend className="font-medium">Share with a class</legend>
            <p className="text-sm text-ash-700">The class’s students and instructor see it on the class page; nobody else gains sight of it.</p>
            {classes.map((cls) => (
              <label key={cls.id} className="flex items-center gap-2">
                <input
                  type="checkbox"
                  checked={classIds.includes(cls.id)}
                  onChange={(event) => setClassIds((ids) => (event.target.checked ? [...ids, cls.id] : ids.filter((id) => id !== cls.id)))}
                />
                {cls.name}
                {cls.term && ` (${cls.term})`}
              </label>
            ))}
          </fieldset>
        )}
      </Section>

      {notice && (
        <p className="alert alert-error" role="alert">
          {notice}
        </p>
      )}
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className="btn btn-primary" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Saving…' : couponId ? 'Save changes' : 'Save coupon and add photos'}
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
