import type { ReactNode } from 'react';

interface Props {
  id: string;
  label: string;
  value: string;
  onChange: (value: string) => void;
  /** Shown after the input: a unit, or a unit switch. */
  unit?: ReactNode;
  hint?: string;
  error?: string;
  step?: string;
  min?: number;
}

/** A number input with its unit, a hint and the error an API answer gave for it. */
export function NumberField({ id, label, value, onChange, unit, hint, error, step = 'any', min }: Props) {
  const describedBy = [hint && `${id}-hint`, error && `${id}-error`].filter(Boolean).join(' ') || undefined;
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <div className="flex items-center gap-2">
        <input
          className="input tabular"
          id={id}
          type="number"
          inputMode="decimal"
          step={step}
          min={min}
          value={value}
          onChange={(event) => onChange(event.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
        />
        {unit}
      </div>
      {hint && (
        <p className="field-hint" id={`${id}-hint`}>
          {hint}
        </p>
      )}
      {error && (
        <p className="field-error" id={`${id}-error`}>
          {error}
        </p>
      )}
    </div>
  );
}
