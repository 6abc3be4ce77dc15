import { useState, type SubmitEvent } from 'react';
import type { AlloyOptionGroup } from '../../lib/tint/alloy-options';
import type { PairSuggestion } from '../../lib/tint/plan-pair';
import { AlloySelect } from './AlloySelect';
import { BasisNote } from './BasisNote';
import { ColourChip } from './ColourChip';
import { postJson } from './post-json';
import { RangeField } from './RangeField';
import { bothUnits, convertTyped, toCelsius } from './temperature';
import { UnitSwitch, type TemperatureUnit } from './UnitSwitch';

interface Props {
  groups: AlloyOptionGroup[];
  defaultAlloys: [string, string];
  signedIn: boolean;
}

interface PairAnswer {
  suggestions: PairSuggestion[];
  bases: { alloy: string; basis: 'library' | 'reference'; couponCount: number }[];
}

type Goal = 'contrast' | 'target';

/** A blank range is left to the planner's defaults; a half-filled one is sent so the API names what is missing. */
function range(min: number | null, max: number | null) {
  return min === null && max === null ? undefined : { min, max };
}
/** Below this ΔE00 between the layers the best "contrast" is no contrast at all. */
const NO_CONTRAST = 1;
const alike = ({ result, goal }: { result: PairAnswer; goal: Goal }) => goal === 'contrast' && (result.suggestions[0]?.score ?? 0) < NO_CONTRAST;
const typedNumber = (value: string) => (value.trim() === '' ? null : Number(value));

/** The laminate pair planner: one heat for two alloys, matched to wanted colours or giving the most contrast. */
export default function PairPlanner({ groups, defaultAlloys, signedIn }: Props) {
  const names = new Map(groups.flatMap((group) => group.alloys.map((alloy) => [alloy.slug, alloy.name] as const)));
  const [alloys, setAlloys] = useState<[string, string]>(defaultAlloys);
  const [goal, setGoal] = useState<Goal>('contrast');
  const [targets, setTargets] = useState<[string, string]>(['#c9a23a', '#2f5fa8']);
  const [unit, setUnit] = useState<TemperatureUnit>('C');
  const [temperatures, setTemperatures] = useState<[string, string]>(['', '']);
  const [holds, setHolds] = useState<[string, string]>(['', '']);
  const [busy, setBusy] = useState(false);
  const [answer, setAnswer] = useState<{ result: PairAnswer; goal: Goal } | null>(null);
  const [error, setError] = useState<{ message: string; field?: string } | null>(null);
  const fieldError = (field: string) => (error?.field === field ? error.message : undefined);
  /** The error of a range or any of its ends (temperatureC, temperatureC.min, temperatureC.max). */
  const rangeError = (field: string) => (error?.field === field || error?.field?.startsWith(`${field}.`) ? error.message : undefined);

  const setAlloy = (i: 0 | 1) => (slug: string) => setAlloys((current) => (i === 0 ? [slug, current[1]] : [current[0], slug]));
  const setTarget = (i: 0 | 1, hex: string) => setTargets((current) => (i === 0 ? [hex, current[1]] : [current[0], hex]));

  function changeUnit(next: TemperatureUnit) {
    setTemperatures(([min, max]) => [convertTyped(min, unit, next), convertTyped(max, unit, next)]);
    setUnit(next);
  }

  async function submit(event: SubmitEvent) {
    event.preventDefault();
    setBusy(true);
    setError(null);
    const body = {
      alloys,
      target: goal === 'target' ? targets : undefined,
      temperatureC: range(toCelsius(temperatures[0], unit), toCelsius(temperatures[1], unit)),
      holdMinutes: range(typedNumber(holds[0]), typedNumber(holds[1])),
    };
    const reply = await postJson<PairAnswer>('/api/tint/plan-pair', body);
    setBusy(false);
    if (reply.ok) setAnswer({ result: reply.body, goal });
    else setError(reply);
  }

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
      <form className="card grid content-start gap-4" onSubmit={submit} noValidate aria-label="Laminate pair">
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-1 xl:grid-cols-2">
          <AlloySelect id="pair-alloy-0" label="First layer" groups={groups} value={alloys[0]} onChange={setAlloy(0)} error={fieldError('alloys.0') ?? fieldError('alloys')} />
          <AlloySelect id="pair-alloy-1" label="Second layer" groups={groups} value={alloys[1]} onChange={setAlloy(1)} error={fieldError('alloys.1')} />
        </div>

        <fieldset className="field">
          <legend className="field-label mb-1">Aim for</legend>
          <div className="flex flex-wrap gap-x-5 gap-y-1">
            <label className="inline-flex min-h-11 items-center gap-2">
              <input type="radio" name="pair-goal" checked={goal === 'contrast'} onChange={() => setGoal('contrast')} />
              The most contrast
            </label>
            <label className="inline-flex min-h-11 items-center gap-2">
              <input type="radio" name="pair-goal" checked={goal === 'target'} onChange={() => setGoal('target')} />
              Two wanted colours
            </label>
          </div>
        </fieldset>

        {goal === 'target' && (
          <div className="grid grid-cols-2 gap-4">
            {([0, 1] as const).map((i) => (
              <div className="field" key={i}>
                <label htmlFor={`pair-target-${i}`}>{i === 0 ? 'First layer colour' : 'Second layer colour'}</label>
                <input className="input h-11 p-1" id={`pair-target-${i}`} type="color" value={targets[i]} onChange={(event) => setTarget(i, event.target.value)} aria-invalid={fieldError(`target.${i}`) ? true : undefined} />
                {fieldError(`target.${i}`) && <p className="field-error">{fieldError(`target.${i}`)}</p>}
              </div>
            ))}
          </div>
        )}

        <RangeField
          id="pair-temperature"
          legend="Temperature range"
          values={temperatures}
          onChange={setTemperatures}
          unit={<UnitSwitch name="pair-unit" value={unit} onChange={changeUnit} />}
          error={rangeError('temperatureC')}
        />
        <RangeField id="pair-hold" legend="Hold time range" values={holds} onChange={setHolds} unit={<span className="w-[5.5rem] shrink-0 text-sm text-ash-600">min</span>} error={rangeError('holdMinutes')} />
        <p className="field-hint -mt-2">Leave the ranges blank for the temperatures both alloys' data cover and holds of 1–120 min.</p>

        <button className="btn btn-primary" type="submit" disabled={busy}>
          {busy ? 'Searching…' : 'Suggest heats'}
        </button>
        {error && (
          <div className="alert alert-error" role="alert">
            {error.message}
          </div>
        )}
      </form>

      <div aria-live="polite">
        {answer ? (
          <section className="card grid gap-3" aria-labelledby="pair-heading" data-testid="pair-suggestions">
            <h2 id="pair-heading" className="text-xl">
              {answer.goal === 'target' ? 'Heats closest to the wanted pair' : 'Heats with the most contrast'}
            </h2>
            {answer.result.bases.every((basis) => basis.basis === 'reference') ? (
              <BasisNote subject="Both layers" basis="reference" couponCount={0} signedIn={signedIn} />
            ) : (
              answer.result.bases.map((basis) => (
                <BasisNote key={basis.alloy} subject={names.get(basis.alloy) ?? basis.alloy} basis={basis.basis} couponCount={basis.couponCount} signedIn={signedIn} />
              ))
            )}
            {answer.result.suggestions.length === 0 ? (
              <p>No heat in these ranges gives a usable pair. Widen the ranges.</p>
            ) : alike(answer) ? (
              <p className="alert">
                On the data available these two alloys colour alike in the same heat, so no heat sets them apart. Library
                coupons of both alloys can tell them apart once there are enough.
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
                        <ColourChip key={layer.alloy} hex={layer.hex} label={`${names.get(layer.alloy) ?? layer.alloy}: ${layer.name}`} detail={`${layer.thicknessNm} nm · ${layer.hex}`} />
                      ))}
                    </div>
                  </li>
                ))}
              </ol>
            )}
          </section>
        ) : (
          <p className="card text-ash-600">Pick the two alloys of a laminate billet: the planner searches temperature and hold time for one heat that colours both layers the way you want.</p>
        )}
      </div>
    </div>
  );
}
