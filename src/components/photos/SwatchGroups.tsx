import { formatLab, formatShare, layerLabel, type PhotoLayer, type PhotoView, type SwatchView } from '~/lib/photos';

/** A swatch as a chip (the look of ui/SwatchChip.astro): its colour, share, hex and L*a*b*. */
function Chip({ swatch, label }: { swatch: SwatchView; label: string }) {
  return (
    <li className="swatch-chip">
      <span className="swatch-colour" style={{ background: swatch.hex }} aria-hidden="true" />
      <span className="grid leading-tight">
        <span className="font-medium">
          {label} <span className="font-mono text-xs text-ash-700">{swatch.hex}</span>
        </span>
        <span className="tabular font-mono text-xs whitespace-pre text-ash-600">{formatLab(swatch.lab)}</span>
      </span>
    </li>
  );
}

/** The measured colours of a photo, per layer (or of the whole photo while no layer is marked). */
export default function SwatchGroups({ photo, layers }: { photo: PhotoView; layers: PhotoLayer[] }) {
  const ordered = [...photo.groups].sort((first, second) => position(first.layerId) - position(second.layerId));
  function position(layerId: number | null) {
    return layerId === null ? -1 : (layers.find((layer) => layer.id === layerId)?.position ?? 99);
  }
  return (
    <div className="space-y-3" aria-label="Swatches">
      {ordered.map((group) => {
        const layer = layers.find((candidate) => candidate.id === group.layerId);
        const title = layer ? layerLabel(layer) : 'Whole photo (no layer marked yet)';
        return (
          <section key={group.regionId ?? 'whole'} aria-label={`Swatches of ${title}`}>
            <h4 className="text-sm font-semibold text-ash-800">{title}</h4>
            {group.tint && (
              <p className="mb-1 text-sm text-ash-700">
                Nearest tint band to the main colour: <strong className="font-semibold">{group.tint.name}</strong>, a film of about{' '}
                {Math.round(group.tint.thicknessNm)} nm (ΔE00 {group.tint.deltaE00.toFixed(1)})
                {group.tint.note && <span className="block text-xs text-ash-600">{group.tint.note}</span>}
              </p>
            )}
            {group.swatches.length === 0 ? (
              <p className="text-sm text-ash-600">No usable pixels here: everything was too dark or too bright.</p>
            ) : (
              <ul className="mt-1 flex flex-wrap gap-2">
                {group.mean && group.swatches.length > 1 && <Chip swatch={group.mean} label="Mean" />}
                {group.swatches.map((swatch, index) => (
                  <Chip key={index} swatch={swatch} label={formatShare(swatch.share)} />
                ))}
              </ul>
            )}
          </section>
        );
      })}
      <p className="text-xs text-ash-600">
        {photo.whiteBalanced
          ? 'White-balanced and exposed from the grey card.'
          : 'Not white-balanced: mark a grey card to remove the light’s colour cast and set the exposure.'}{' '}
        Colours are CIELAB (D65); screen and print show them only approximately.
      </p>
    </div>
  );
}
