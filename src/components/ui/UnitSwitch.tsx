import { useController, type FieldValues } from 'react-hook-form';
import type { BoundField } from './form-field';

export type TemperatureUnit = 'C' | 'F';

interface Props<T extends FieldValues> extends BoundField<T> {
  /** The radios' name, unique on the page. */
  radioName: string;
  /** Called after the unit changed, e.g. to convert what was typed. */
  onSwitch?: (to: TemperatureUnit, from: TemperatureUnit) => void;
}

/** °C / °F as a pair of radio buttons, bound to a form field. */
export function UnitSwitch<T extends FieldValues>({ control, name, radioName, onSwitch }: Props<T>) {
  const { field } = useController({ control, name });
  const choose = (unit: TemperatureUnit) => {
    const from = field.value as TemperatureUnit;
    field.onChange(unit);
    if (unit !== from) onSwitch?.(unit, from);
  };
  return (
    <fieldset className="flex shrink-0 overflow-hidden rounded-lg border border-ash-300 bg-white text-sm">
      <legend className="sr-only">Temperature unit</legend>
      {(['C', 'F'] as const).map((unit) => (
        <label
          key={unit}
          className="flex min-h-11 min-w-11 cursor-pointer items-center justify-center px-2 has-[:checked]:bg-ash-800 has-[:checked]:text-white has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-temper-600"
        >
          <input className="sr-only" type="radio" name={radioName} value={unit} checked={field.value === unit} onChange={() => choose(unit)} />°{unit}
        </label>
      ))}
    </fieldset>
  );
}
