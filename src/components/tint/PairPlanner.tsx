import { useState } from 'react';
import { useController, useWatch } from 'react-hook-form';
import type { AlloyOptionGroup } from '~/lib/tint/alloy-options';
import type { PairAnswer } from '~/lib/tint/responses';
import { callApi } from '~/components/api-client';
import { useRequestForm } from '~/components/request-form';
import { RangeField } from '~/components/ui/RangeField';
import { SelectField } from '~/components/ui/SelectField';
import { TextField } from '~/components/ui/TextField';
import { UnitSwitch } from '~/components/ui/UnitSwitch';
import { BasisNote } from './BasisNote';
import { ColourChip } from './ColourChip';
import { alloyChoices, pairFieldOf, pairResolver, showRefusal, type Goal } from './planner-forms';
import { PlannerForm } from './PlannerForm';
import { bothUnits, convertTyped } from './temperature';

interface Props {
  groups: AlloyOptionGroup[];
  defaultAlloys: [string, string];
  signedIn: boolean;
}

const atmosphereChoices = [
  { value: 'air', label: 'Air' },
  { value: 'argon', label: 'Argon (purged can)' },
  { value: 'other', label: 'Other' },
];

/** Below this ΔE00 between the layers the best "contrast" is no contrast at all. */
const NO_CONTRAST = 1;
const alike = ({ result, goal }: { result: PairAnswer; goal: Goal }) => goal === 'contrast' && (result.suggestions[0]?.score ?? 0) < NO_CONTRAST;

/** The laminate pair planner: one heat for two alloys, matched to wanted colours or giving the most contrast. */
export default function PairPlanner({ groups, defaultAlloys, signedIn }: Props) {
  const names = new Map(groups.flatMap((group) => group.alloys.map((alloy) => [alloy.slug, alloy.name] as const)));
  const choices = alloyChoices(groups);
  const { control, handleSubmit, getValues, setValue, setError, formState } = useRequestForm(
    {
      alloys: defaultAlloys,
      goal: 'contrast',
      targets: ['#c9a23a', '#2f5fa8'],
      unit: 'C',
      temperature: ['', ''],
      hold: ['', ''],
      atmosphere: 'air',
      widen: false,
    },
    pairResolver,
  );
  const goal = useWatch({ control, name: 'goal' });
  const goalField = useController({ control, name: 'goal' }).field;
  const widenField = useController({ control, name: 'widen' }).field;
  const [answer, setAnswer] = useState<{ result: PairAnswer; goal: Goal } | null>(null);

  const suggest = handleSubmit(async (request) => {
    const wanted = getValues('goal');
    const reply = await callApi<PairAnswer>('/api/tint/plan-pair', { method: 'POST', body: request });
    if (reply.ok) setAnswer({ result: reply.body, goal: wanted });
    else showRefusal(setError, reply, pairFieldOf);
  });

  const convertRange = (to: 'C' | 'F', from: 'C' | 'F') => {
    const [min, max] = getValues('temperature');
    setValue('temperature', [convertTyped(min, from, to), convertTyped(max, from, to)]);
  };

  const suggestions = answer ? (
    <section className="card grid gap-3" aria-labelledby="pair-heading" data-testid="pair-suggestions">
      <h2 id="pair-heading" className="text-xl">
        {answer.goal === 'target' ? 'Heats closest to the wanted pair' : 'Heats with the most contrast'}
      </h2>
      {answer.result.bases.every((basis) => basis.basis === 'reference') ? (
        <BasisNote subject="Both layers" basis="reference" couponCount={0} signedIn={signedIn} />
      ) : (
        answer.result.bases.map((basis) => (
          <BasisNote
            key={basis.alloy}
            subject={names.get(basis.alloy) ?? basis.alloy}
            basis={basis.basis}
            couponCount={basis.couponCount}
            signedIn={signedIn}
          />
        ))
      )}
      {answer.result.search.temperatureC && (
        <p className="text-sm text-ash-600" data-testid="pair-search">
          Searched {bothUnits(answer.result.search.temperatureC.min)} to {bothUnits(answer.result.search.temperatureC.max)}
          {answer.result.search.widened ? ', beyond what both alloys’ data cover where marked.' : ', inside what both alloys’ data cover.'}
        </p>
      )}
      {answer.result.note ? (
        <p className="alert" data-testid="pair-note">
          {answer.result.note}
        </p>
      ) : answer.result.suggestions.length === 0 ? (
        <p>No heat in these ranges gives a usable pair. Widen the ranges.</p>
      ) : alike(answer) ? (
        <p className="alert">
          On the data available these two alloys colour alike in the same heat, so no heat sets them apart. Library coupons of both alloys can tell them apart
          once there are enough.
        </p>
      ) : (
        <ol className="grid gap-3">
          {answer.result.suggestions.map((suggestion, i) => (
            <li key={`${suggestion.temperatureC}-${suggestion.holdMinutes}`} className="grid gap-2 border-t border-ash-200 pt-3 first:border-t-0 first:pt-0">
              <p className="font-medium tabular">
                {i + 1}. {bothUnits(suggestion.temperatureC)} for {suggestion.holdMinutes} min
                <span className="ml-2 text-sm font-normal text-ash-600">
                  {answer.goal === 'target' ? `ΔE00 from the wanted pair ${suggestion.score}` : `ΔE00 between the layers ${suggestion.score}`}
                </span>
              </p>
              <div className="flex flex-wrap gap-2">
                {suggestion.layers.map((layer) => (
                  <ColourChip
                    key={layer.alloy}
                    hex={layer.hex}
                    label={`${names.get(layer.alloy) ?? layer.alloy}: ${layer.name}`}
                    detail={`${layer.thicknessNm} nm · ${layer.hex}`}
                  />
                ))}
              </div>
              {suggestion.outsideCalibrated && (
                <p className="alert alert-caution text-sm" data-testid="extrapolated">
                  Outside the temperatures the data cover: an extrapolation.
                </p>
              )}
              <details className="text-sm">
                <summary>Warnings for this heat ({suggestion.warnings.length})</summary>
                <ul className="mt-2 grid gap-2">
                  {suggestion.warnings.map((warning) => (
                    <li key={`${warning.code}-${warning.message}`} className="alert alert-caution" data-warning={warning.code}>
                      <p>{warning.message}</p>
                      <p className="mt-1 text-xs">Source: {warning.source}</p>
                    </li>
                  ))}
                </ul>
              </details>
            </li>
          ))}
        </ol>
      )}
    </section>
  ) : (
    <p className="card text-ash-600">
      Pick the two alloys of a laminate billet: the planner searches temperature and hold time for one heat that colours both layers the way you want.
    </p>
  );

  return (
    <PlannerForm label="Laminate pair" submit="Suggest heats" busyLabel="Searching…" onSubmit={suggest} state={formState} answer={suggestions}>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-1 xl:grid-cols-2">
        <SelectField control={control} name="alloys.0" id="pair-alloy-0" label="First layer" groups={choices} />
        <SelectField control={control} name="alloys.1" id="pair-alloy-1" label="Second layer" groups={choices} />
      </div>

      <fieldset className="field">
        <legend className="field-label mb-1">Aim for</legend>
        <div className="flex flex-wrap gap-x-5 gap-y-1">
          {(['contrast', 'target'] as const).map((option) => (
            <label key={option} className="inline-flex min-h-11 items-center gap-2">
              <input type="radio" name="pair-goal" value={option} checked={goal === option} onChange={() => goalField.onChange(option)} />
              {option === 'contrast' ? 'The most contrast' : 'Two wanted colours'}
            </label>
          ))}
        </div>
      </fieldset>

      {goal === 'target' && (
        <div className="grid grid-cols-2 gap-4">
          {([0, 1] as const).map((i) => (
            <TextField
              key={i}
              control={control}
              name={`targets.${i}`}
              id={`pair-target-${i}`}
              label={i === 0 ? 'First layer colour' : 'Second layer colour'}
              type="color"
              className="input h-11 p-1"
            />
          ))}
        </div>
      )}

      <RangeField
        control={control}
        name="temperature"
        id="pair-temperature"
        legend="Temperature range"
        unit={<UnitSwitch control={control} name="unit" radioName="pair-unit" onSwitch={convertRange} />}
      />
      <RangeField
        control={control}
        name="hold"
        id="pair-hold"
        legend="Hold time range"
        unit={<span className="w-[5.5rem] shrink-0 text-sm text-ash-600">min</span>}
      />
      <p className="field-hint -mt-2">Leave the ranges blank for the temperatures both alloys' data cover and holds of 1–120 min.</p>
      <SelectField control={control} name="atmosphere" id="pair-atmosphere" label="Atmosphere" options={atmosphereChoices} />
      <label className="inline-flex min-h-11 items-center gap-2">
        <input type="checkbox" name="pair-widen" checked={widenField.value ?? false} onChange={(event) => widenField.onChange(event.target.checked)} />
        Search beyond the temperatures both alloys' data cover (extrapolated heats are marked)
      </label>
    </PlannerForm>
  );
}
