import { useState } from 'react';
import { useController, useWatch } from 'react-hook-form';
import type { AlloyOptionGroup } from '~/lib/tint/alloy-options';
import type { PredictAnswer } from '~/lib/tint/responses';
import { callApi } from '~/components/api-client';
import { useRequestForm } from '~/components/request-form';
import { FieldError } from '~/components/ui/FieldError';
import { NumberField } from '~/components/ui/NumberField';
import { SelectField } from '~/components/ui/SelectField';
import { UnitSwitch } from '~/components/ui/UnitSwitch';
import { alloyChoices, heatFieldOf, heatResolver, showRefusal, usableProcess, type Atmosphere } from './planner-forms';
import { PlannerForm } from './PlannerForm';
import { PredictionResult } from './PredictionResult';
import { convertTyped } from './temperature';

interface Props {
  groups: AlloyOptionGroup[];
  defaultAlloy: string;
  signedIn: boolean;
}

const atmosphereLabels: Record<Atmosphere, string> = { air: 'Air', argon: 'Argon', other: 'Other' };
const atmosphereChoices = (Object.keys(atmosphereLabels) as Atmosphere[]).map((value) => ({ value, label: atmosphereLabels[value] }));

/** The heat planner form: a planned heat or anodizing run → the predicted tint band, its basis and warnings. */
export default function HeatPlanner({ groups, defaultAlloy, signedIn }: Props) {
  const alloys = groups.flatMap((group) => group.alloys);
  const optionOf = (slug: string) => alloys.find((option) => option.slug === slug);
  const { control, handleSubmit, getValues, setValue, setError, formState } = useRequestForm(
    { alloy: defaultAlloy, process: 'heat', temperature: '600', unit: 'C', holdMinutes: '60', atmosphere: 'air', volts: '20' },
    heatResolver(alloys),
  );
  const [alloy, process] = useWatch({ control, name: ['alloy', 'process'] });
  const processField = useController({ control, name: 'process' }).field;
  const [result, setResult] = useState<{ prediction: PredictAnswer; planned: string } | null>(null);

  const chosen = optionOf(alloy);
  const canHeat = chosen?.heat ?? true;
  const canAnodize = chosen?.anodize ?? true;
  const effectiveProcess = usableProcess(process, chosen);

  const predict = handleSubmit(async (request) => {
    const typed = getValues();
    const answer = await callApi<PredictAnswer>('/api/tint/predict', { method: 'POST', body: request });
    if (!answer.ok) return showRefusal(setError, answer, heatFieldOf);
    const alloyName = optionOf(typed.alloy)?.name ?? typed.alloy;
    const planned =
      request.process === 'heat'
        ? `${alloyName}: ${typed.temperature} °${typed.unit} for ${typed.holdMinutes} min in ${atmosphereLabels[typed.atmosphere].toLowerCase()}`
        : `${alloyName}: anodized at ${typed.volts} V`;
    setResult({ prediction: answer.body, planned });
  });

  const answer = result ? (
    <PredictionResult prediction={result.prediction} planned={result.planned} signedIn={signedIn} />
  ) : (
    <p className="card text-ash-600">
      Choose an alloy and a heat, then predict: the band of tints, which data it rests on and the cautions that apply appear here.
    </p>
  );

  return (
    <PlannerForm label="Planned heat" submit="Predict the tint" busyLabel="Predicting…" onSubmit={predict} state={formState} answer={answer}>
      <SelectField control={control} name="alloy" id="planner-alloy" label="Alloy" groups={alloyChoices(groups)} />

      <fieldset className="field">
        <legend className="field-label mb-1">Process</legend>
        <div className="flex flex-wrap gap-x-5 gap-y-1">
          {(['heat', 'anodize'] as const).map((option) => (
            <label key={option} className="inline-flex min-h-11 items-center gap-2">
              <input
                type="radio"
                name="planner-process"
                value={option}
                checked={effectiveProcess === option}
                disabled={option === 'heat' ? !canHeat : !canAnodize}
                onChange={() => processField.onChange(option)}
              />
              {option === 'heat' ? 'Heat (oven, forge, torch)' : 'Anodizing'}
            </label>
          ))}
        </div>
        {(!canHeat || !canAnodize) && (
          <p className="field-hint">
            {chosen?.name} has {canHeat ? 'no anodizing' : 'no heat-growth'} model yet.
          </p>
        )}
        <FieldError id="planner-process-error" message={formState.errors.process?.message} />
      </fieldset>

      {effectiveProcess === 'heat' ? (
        <>
          <NumberField
            control={control}
            name="temperature"
            id="planner-temperature"
            label="Temperature"
            unit={
              <UnitSwitch
                control={control}
                name="unit"
                radioName="planner-unit"
                onSwitch={(to, from) => setValue('temperature', convertTyped(getValues('temperature'), from, to))}
              />
            }
            hint="Metal temperature at the hold."
          />
          <NumberField
            control={control}
            name="holdMinutes"
            id="planner-hold"
            label="Hold time"
            unit={<span className="text-sm text-ash-600">min</span>}
            min={0}
          />
          <SelectField control={control} name="atmosphere" id="planner-atmosphere" label="Atmosphere" options={atmosphereChoices} />
          <p className="field-hint -mt-2">The reference data are heats in air; a heat under argon rests on the library's argon coupons.</p>
        </>
      ) : (
        <NumberField control={control} name="volts" id="planner-volts" label="Cell voltage" unit={<span className="text-sm text-ash-600">V</span>} min={0} />
      )}
    </PlannerForm>
  );
}
