export type TemperatureUnit = 'C' | 'F';

/** °C / °F as a pair of radio buttons. */
export function UnitSwitch({ name, value, onChange }: { name: string; value: TemperatureUnit; onChange: (unit: TemperatureUnit) => void }) {
  return (
    <fieldset className="flex shrink-0 overflow-hidden rounded-lg border border-ash-300 bg-white text-sm">
      <legend className="sr-only">Temperature unit</legend>
      {(['C', 'F'] as const).map((unit) => (
        <label key={unit} className="flex min-h-11 min-w-11 cursor-pointer items-center justify-center px-2 has-[:checked]:bg-ash-800 has-[:checked]:text-white has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-temper-600">
          <input className="sr-only" type="radio" name={name} value={unit} checked={value === unit} onChange={() => onChange(unit)} />°{unit}
        </label>
      ))}
    </fieldset>
  );
}
