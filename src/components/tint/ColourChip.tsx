/** A colour with its name and a detail line, in the design system's swatch-chip style. */
export function ColourChip({ hex, label, detail }: { hex: string; label: string; detail?: string }) {
  return (
    <span className="swatch-chip">
      <span className="swatch-colour shrink-0" style={{ background: hex }} aria-hidden="true" />
      <span className="grid leading-tight">
        <span className="font-medium">{label}</span>
        <span className="tabular font-mono text-xs text-ash-600">{detail ?? hex}</span>
      </span>
    </span>
  );
}
