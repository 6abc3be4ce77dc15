import type { FieldPath, FieldValues, UseFormSetError } from 'react-hook-form';
import type { AlloyOption, AlloyOptionGroup } from '~/lib/tint/alloy-options';
import { planPairRequestSchema, predictRequestSchema } from '~/lib/tint/planner-requests';
import type { ApiFailure } from '~/components/api-client';
import { asTheApiSays, requestResolver } from '~/components/request-form';
import type { OptionGroup } from '~/components/ui/SelectField';
import type { TemperatureUnit } from '~/components/ui/UnitSwitch';
import { toCelsius } from './temperature';

/** What the two planner forms hold (numbers as typed, temperatures in the chosen unit) and the requests they send. */

export type Process = 'heat' | 'anodize';
export type Atmosphere = 'air' | 'argon' | 'other';
export type Goal = 'contrast' | 'target';

export interface HeatForm {
  alloy: string;
  process: Process;
  temperature: string;
  unit: TemperatureUnit;
  holdMinutes: string;
  atmosphere: Atmosphere;
  volts: string;
}

export interface PairForm {
  alloys: [string, string];
  goal: Goal;
  targets: [string, string];
  unit: TemperatureUnit;
  /** From and to, as typed. */
  temperature: [string, string];
  hold: [string, string];
  atmosphere?: Atmosphere;
  /** Search beyond the temperatures both alloys' data cover. */
  widen?: boolean;
}

const typedNumber = (value: string) => (value.trim() === '' ? null : Number(value));

/** The process the planner can use for an alloy: the one chosen, unless the alloy has no model for it. */
export function usableProcess(process: Process, alloy: AlloyOption | undefined): Process {
  if (process === 'heat' && alloy?.heat === false) return 'anodize';
  if (process === 'anodize' && alloy?.anodize === false) return 'heat';
  return process;
}

/** The body of POST /api/tint/predict. */
export function predictRequestOf(form: HeatForm, alloy: AlloyOption | undefined) {
  return usableProcess(form.process, alloy) === 'heat'
    ? {
        alloy: form.alloy,
        process: 'heat' as const,
        temperatureC: toCelsius(form.temperature, form.unit),
        holdMinutes: typedNumber(form.holdMinutes),
        atmosphere: form.atmosphere,
      }
    : { alloy: form.alloy, process: 'anodize' as const, volts: typedNumber(form.volts) };
}

/** The heat planner's field for an error the predict route names. */
export const heatFieldOf = (path: string) => (path === 'temperatureC' ? 'temperature' : path);

/** The heat planner's form checked as the predict route will check its request, and its one error worded the same. */
export const heatResolver = (alloys: readonly AlloyOption[]) =>
  requestResolver({
    schema: predictRequestSchema,
    requestOf: (form: HeatForm) =>
      predictRequestOf(
        form,
        alloys.find((option) => option.slug === form.alloy),
      ),
    errorAt: (path, message) => ({ field: heatFieldOf(path), message: asTheApiSays(path, message) }),
    firstOnly: true,
  });

/** A blank range is left to the planner's defaults; a half-filled one is sent so the API names what is missing. */
function range(min: number | null, max: number | null) {
  return min === null && max === null ? undefined : { min, max };
}

/** The body of POST /api/tint/plan-pair. */
export function planPairRequestOf(form: PairForm) {
  return {
    alloys: form.alloys,
    target: form.goal === 'target' ? form.targets : undefined,
    temperatureC: range(toCelsius(form.temperature[0], form.unit), toCelsius(form.temperature[1], form.unit)),
    holdMinutes: range(typedNumber(form.hold[0]), typedNumber(form.hold[1])),
    // Sent only when not the default (air, inside the data's range).
    atmosphere: form.atmosphere === undefined || form.atmosphere === 'air' ? undefined : form.atmosphere,
    widen: form.widen ? true : undefined,
  };
}

/** The pair planner's field for an error the plan-pair route names: a range shows the errors of either end. */
export function pairFieldOf(path: string): string {
  const [first, second] = path.split('.');
  if (first === 'alloys' && (second === undefined || second === '0')) return 'alloys.0';
  if (first === 'alloys' && second === '1') return 'alloys.1';
  if (first === 'target' && second !== undefined) return `targets.${second}`;
  if (first === 'temperatureC') return 'temperature';
  if (first === 'holdMinutes') return 'hold';
  return path;
}

/** The pair planner's form checked as the plan-pair route will check its request, and its one error worded the same. */
export const pairResolver = requestResolver({
  schema: planPairRequestSchema,
  requestOf: planPairRequestOf,
  errorAt: (path, message) => ({ field: pairFieldOf(path), message: asTheApiSays(path, message) }),
  firstOnly: true,
});

/** The planner's alloys as the choices of a select, grouped by family. */
export const alloyChoices = (groups: AlloyOptionGroup[]): OptionGroup[] =>
  groups.map((group) => ({ label: group.label, options: group.alloys.map((alloy) => ({ value: alloy.slug, label: alloy.name })) }));

/** A refused request shown like the form's own errors: beside the field it names, and in the form's alert. */
export function showRefusal<Form extends FieldValues>(setError: UseFormSetError<Form>, failure: ApiFailure, fieldOf: (path: string) => string) {
  if (failure.field) setError(fieldOf(failure.field) as FieldPath<Form>, { message: failure.message });
  setError('root', { message: failure.message });
}
