import type { AlloyOptionGroup } from '../../lib/tint/alloy-options';

interface Props {
  id: string;
  label: string;
  groups: AlloyOptionGroup[];
  value: string;
  onChange: (slug: string) => void;
  error?: string;
}

/** A select of alloys grouped by family, with the error an API answer gave for it. */
export function AlloySelect({ id, label, groups, value, onChange, error }: Props) {
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <select className="input" id={id} value={value} onChange={(event) => onChange(event.target.value)} aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-error` : undefined}>
        {groups.map((group) => (
          <optgroup key={group.label} label={group.label}>
            {group.alloys.map((alloy) => (
              <option key={alloy.slug} value={alloy.slug}>
                {alloy.name}
              </option>
            ))}
          </optgroup>
        ))}
      </select>
      {error && (
        <p className="field-error" id={`${id}-error`}>
          {error}
        </p>
      )}
    </div>
  );
}
