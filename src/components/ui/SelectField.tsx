import type { SelectHTMLAttributes } from 'react';
import { useController, type FieldValues } from 'react-hook-form';
import { FieldError } from './FieldError';
import type { BoundField } from './form-field';

export interface Option {
  value: string;
  label: string;
}

export interface OptionGroup {
  label: string;
  options: readonly Option[];
}

/** Options from a list of values and their labels. */
export const optionsOf = <V extends string>(values: readonly V[], labels: Record<V, string>): Option[] =>
  values.map((value) => ({ value, label: labels[value] }));

type SelectProps = Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id' | 'name' | 'value' | 'defaultValue' | 'onChange' | 'onBlur' | 'children'>;

interface Props<T extends FieldValues> extends BoundField<T>, SelectProps {
  /** The select's id; the field's name unless given. */
  id?: string;
  label: string;
  /** A first, empty choice such as "Choose…". */
  placeholder?: string;
  options?: readonly Option[];
  groups?: readonly OptionGroup[];
}

/**
 * A labelled select bound to a form field, with its error. A field whose message is shown
 * elsewhere (one message under a list of selects) passes its own aria-invalid and aria-describedby.
 */
export function SelectField<T extends FieldValues>({
  control,
  name,
  id = name,
  label,
  placeholder,
  options = [],
  groups = [],
  className = 'input',
  ...select
}: Props<T>) {
  const { field, fieldState } = useController({ control, name });
  const error = fieldState.error?.message;
  const option = ({ value, label }: Option) => (
    <option key={value} value={value}>
      {label}
    </option>
  );
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <select
        {...field}
        {...select}
        className={className}
        id={id}
        aria-invalid={error ? true : select['aria-invalid']}
        aria-describedby={error ? `${id}-error` : select['aria-describedby']}
      >
        {placeholder !== undefined && <option value="">{placeholder}</option>}
        {options.map(option)}
        {groups.map((group) => (
          <optgroup key={group.label} label={group.label}>
            {group.options.map(option)}
          </optgroup>
        ))}
      </select>
      <FieldError id={`${id}-error`} message={error} />
    </div>
  );
}
