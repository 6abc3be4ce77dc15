/** A colour with its name and a detail line, in the design system's swatch-chip style. */
export function ColourChip({ hex, label, detail, large = false }: { hex: string; label: string; detail?: string; large?: boolean }) {
  return (
    <span className="swatch-chip">
      <span className={large ? 'swatch-colour !h-14 !w-14' : 'swatch-colour'} style={{ background: hex }} aria-hidden="true" />
      <span className="grid leading-tight">
        <span className="font-medium">{label}</span>
        <span className="tabular font-mono text-xs text-ash-600">{detail ?? hex}</span>
      </span>
    </span>
  );
}
