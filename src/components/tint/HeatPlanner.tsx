import { useState, type SubmitEvent } from 'react';
import type { AlloyOptionGroup } from '../../lib/tint/alloy-options';
import type { Prediction } from '../../lib/tint/predict';
import { AlloySelect } from './AlloySelect';
import { NumberField } from './NumberField';
import { PredictionResult } from './PredictionResult';
import { postJson } from './post-json';
import { toCelsius, convertTyped } from './temperature';
import { UnitSwitch, type TemperatureUnit } from './UnitSwitch';

interface Props {
  groups: AlloyOptionGroup[];
  defaultAlloy: string;
  signedIn: boolean;
}

type Process = 'heat' | 'anodize';
type Atmosphere = 'air' | 'argon' | 'other';
const atmosphereLabels: Record<Atmosphere, string> = { air: 'Air', argon: 'Argon', other: 'Other' };

/** The heat planner form: a planned heat or anodizing run → the predicted tint band, its basis and warnings. */
export default function HeatPlanner({ groups, defaultAlloy, signedIn }: Props) {
  const alloys = groups.flatMap((group) => group.alloys);
  const [alloy, setAlloy] = useState(defaultAlloy);
  const chosen = alloys.find((option) => option.slug === alloy);
  const [process, setProcess] = useState<Process>('heat');
  const [temperature, setTemperature] = useState('600');
  const [unit, setUnit] = useState<TemperatureUnit>('C');
  const [holdMinutes, setHoldMinutes] = useState('60');
  const [atmosphere, setAtmosphere] = useState<Atmosphere>('air');
  const [volts, setVolts] = useState('20');
  const [busy, setBusy] = useState(false);
  const [result, setResult] = useState<{ prediction: Prediction; planned: string } | null>(null);
  const [error, setError] = useState<{ message: string; field?: string } | null>(null);

  const canHeat = chosen?.heat ?? true;
  const canAnodize = chosen?.anodize ?? true;
  const effectiveProcess: Process = process === 'heat' && !canHeat ? 'anodize' : process === 'anodize' && !canAnodize ? 'heat' : process;
  const fieldError = (field: string) => (error?.field === field ? error.message : undefined);

  function changeUnit(next: TemperatureUnit) {
    setTemperature(convertTyped(temperature, unit, next));
    setUnit(next);
  }

  async function submit(event: SubmitEvent) {
    event.preventDefault();
    setBusy(true);
    setError(null);
    const temperatureC = toCelsius(temperature, unit);
    const hold = holdMinutes.trim() === '' ? null : Number(holdMinutes);
    const voltage = volts.trim() === '' ? null : Number(volts);
    const body =
      effectiveProcess === 'heat'
        ? { alloy, process: 'heat', temperatureC, holdMinutes: hold, atmosphere }
        : { alloy, process: 'anodize', volts: voltage };
    const answer = await postJson<Prediction>('/api/tint/predict', body);
    setBusy(false);
    if (!answer.ok) {
      setError(answer);
      return;
    }
    const alloyName = chosen?.name ?? alloy;
    const planned =
      effectiveProcess === 'heat'
        ? `${alloyName}: ${temperature} °${unit} for ${holdMinutes} min in ${atmosphereLabels[atmosphere].toLowerCase()}`
        : `${alloyName}: anodized at ${volts} V`;
    setResult({ prediction: answer.body, planned });
  }

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
      <form className="card grid content-start gap-4" onSubmit={submit} noValidate aria-label="Planned heat">
        <AlloySelect id="planner-alloy" label="Alloy" groups={groups} value={alloy} onChange={setAlloy} error={fieldError('alloy')} />

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
                  onChange={() => setProcess(option)}
                />
                {option === 'heat' ? 'Heat (oven, forge, torch)' : 'Anodizing'}
              </label>
            ))}
          </div>
          {(!canHeat || !canAnodize) && (
            <p className="field-hint">{chosen?.name} has {canHeat ? 'no anodizing' : 'no heat-growth'} model yet.</p>
          )}
          {fieldError('process') && <p className="field-error">{fieldError('process')}</p>}
        </fieldset>

        {effectiveProcess === 'heat' ? (
          <>
            <NumberField
              id="planner-temperature"
              label="Temperature"
              value={temperature}
              onChange={setTemperature}
              unit={<UnitSwitch name="planner-unit" value={unit} onChange={changeUnit} />}
              hint="Metal temperature at the hold."
              error={fieldError('temperatureC')}
            />
            <NumberField id="planner-hold" label="Hold time" value={holdMinutes} onChange={setHoldMinutes} unit={<span className="text-sm text-ash-600">min</span>} error={fieldError('holdMinutes')} min={0} />
            <div className="field">
              <label htmlFor="planner-atmosphere">Atmosphere</label>
              <select className="input" id="planner-atmosphere" value={atmosphere} onChange={(event) => setAtmosphere(event.target.value as Atmosphere)}>
                {(Object.keys(atmosphereLabels) as Atmosphere[]).map((option) => (
                  <option key={option} value={option}>
                    {atmosphereLabels[option]}
                  </option>
                ))}
              </select>
              {fieldError('atmosphere') && <p className="field-error">{fieldError('atmosphere')}</p>}
            </div>
          </>
        ) : (
          <NumberField id="planner-volts" label="Cell voltage" value={volts} onChange={setVolts} unit={<span className="text-sm text-ash-600">V</span>} error={fieldError('volts')} min={0} />
        )}

        <button className="btn btn-primary" type="submit" disabled={busy}>
          {busy ? 'Predicting…' : 'Predict the tint'}
        </button>
        {error && (
          <div className="alert alert-error" role="alert">
            {error.message}
          </div>
        )}
      </form>

      <div aria-live="polite">
        {result ? (
          <PredictionResult prediction={result.prediction} planned={result.planned} signedIn={signedIn} />
        ) : (
          <p className="card text-ash-600">Choose an alloy and a heat, then predict: the band of tints, which data it rests on and the cautions that apply appear here.</p>
        )}
      </div>
    </div>
  );
}
