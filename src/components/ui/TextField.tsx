import type { InputHTMLAttributes, ReactNode } from 'react';
import { useController, type FieldValues } from 'react-hook-form';
import { FieldError } from './FieldError';
import { describedBy, type BoundField } from './form-field';

type InputProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'id' | 'name' | 'value' | 'defaultValue' | 'onChange' | 'onBlur'>;

export interface TextFieldProps<T extends FieldValues> extends BoundField<T>, InputProps {
  /** The input's id; the field's name unless given. */
  id?: string;
  label: string;
  hint?: string;
  /** Shown after the input: a unit, or a unit switch. */
  unit?: ReactNode;
}

/** A labelled input bound to a form field, with its hint and its error. */
export function TextField<T extends FieldValues>({ control, name, id = name, label, hint, unit, className = 'input', ...input }: TextFieldProps<T>) {
  const { field, fieldState } = useController({ control, name });
  const error = fieldState.error?.message;
  const element = (
    <input {...field} {...input} className={className} id={id} aria-invalid={error ? true : undefined} aria-describedby={describedBy(id, hint, error)} />
  );
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      {unit ? (
        <div className="flex items-center gap-2">
          {element}
          {unit}
        </div>
      ) : (
        element
      )}
      {hint && (
        <p className="field-hint" id={`${id}-hint`}>
          {hint}
        </p>
      )}
      <FieldError id={`${id}-error`} message={error} />
    </div>
  );
}
