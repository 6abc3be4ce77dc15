import type { ReactNode } from 'react';

interface Props {
  id: string;
  legend: string;
  values: [string, string];
  onChange: (values: [string, string]) => void;
  /** Shown after the inputs: a unit, or a unit switch. */
  unit: ReactNode;
  error?: string;
}

/** A "from … to …" pair of number inputs sharing one unit, with the error an API answer gave for either. */
export function RangeField({ id, legend, values, onChange, unit, error }: Props) {
  const input = (i: 0 | 1, label: string) => (
    <input
      className="input tabular min-w-0"
      id={`${id}-${i === 0 ? 'min' : 'max'}`}
      type="number"
      inputMode="decimal"
      step="any"
      aria-label={`${legend}: ${label}`}
      placeholder={label}
      value={values[i]}
      onChange={(event) => onChange(i === 0 ? [event.target.value, values[1]] : [values[0], event.target.value])}
      aria-invalid={error ? true : undefined}
      aria-describedby={error ? `${id}-error` : undefined}
    />
  );
  return (
    <fieldset className="field">
      <legend className="field-label mb-1">{legend}</legend>
      <div className="flex items-center gap-2">
        {input(0, 'from')}
        <span className="text-sm text-ash-600">to</span>
        {input(1, 'to')}
        {unit}
      </div>
      {error && (
        <p className="field-error" id={`${id}-error`}>
          {error}
        </p>
      )}
    </fieldset>
  );
}
