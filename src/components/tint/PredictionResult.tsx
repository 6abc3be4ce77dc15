import type { Prediction } from '~/lib/tint/predict';
import type { NoPrediction, PredictAnswer } from '~/lib/tint/responses';
import type { HeatWarning } from '~/lib/tint/warnings';
import { BasisNote } from './BasisNote';
import { ColourChip } from './ColourChip';
import { bothUnits } from './temperature';

interface Props {
  prediction: PredictAnswer;
  planned: string;
  signedIn: boolean;
}

function Warnings({ warnings }: { warnings: HeatWarning[] }) {
  if (warnings.length === 0) return null;
  return (
    <div className="grid gap-2" data-testid="warnings">
      <h3 className="text-base">Warnings for this heat</h3>
      <ul className="grid gap-2">
        {warnings.map((warning) => (
          <li key={`${warning.code}-${warning.message}`} className="alert alert-caution" data-warning={warning.code}>
            <p>{warning.message}</p>
            <p className="mt-1 text-xs">Source: {warning.source}</p>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** A heat with no honest prediction: why, what the library has (argon coupons) and the warnings. */
function NoPredictionResult({ answer, planned }: { answer: NoPrediction; planned: string }) {
  const coupons = answer.library.argonCoupons;
  return (
    <section className="card grid gap-4" aria-labelledby="prediction-heading" data-testid="prediction" data-outcome="none">
      <div>
        <p className="text-sm text-ash-600">{planned}</p>
        <h2 id="prediction-heading" className="text-xl">
          No prediction for this heat
        </h2>
      </div>
      <p data-testid="no-prediction-reason" data-reason={answer.reason}>
        {answer.message}
      </p>
      {coupons.length > 0 && (
        <div className="grid gap-2">
          <h3 className="text-base">What the library has under argon</h3>
          <ul className="flex flex-wrap gap-2">
            {coupons.map((coupon, i) => (
              <li key={i}>
                <ColourChip
                  hex={coupon.hex ?? '#c8c8c8'}
                  label={`${bothUnits(coupon.temperatureC)}, ${Number(coupon.holdMinutes.toFixed(1))} min`}
                  detail={`≈ ${coupon.thicknessNm} nm (air: ≈ ${coupon.airNm} nm)`}
                />
              </li>
            ))}
          </ul>
        </div>
      )}
      <Warnings warnings={answer.warnings} />
    </section>
  );
}

/** The predicted band of a planned heat (its ends and middle, the colours across it, the basis and the warnings), or why there is none. */
export function PredictionResult({ prediction, planned, signedIn }: Props) {
  if (prediction.outcome === 'none') return <NoPredictionResult answer={prediction} planned={planned} />;
  return <PredictedBand prediction={prediction} planned={planned} signedIn={signedIn} />;
}

function PredictedBand({ prediction, planned, signedIn }: { prediction: Prediction; planned: string; signedIn: boolean }) {
  const { band, colour, thicknessNm, warnings } = prediction;
  const first = band[0];
  const last = band[band.length - 1];
  const ends = [
    { key: 'low', title: 'Thinner end', hex: first.hex, name: first.name, nm: thicknessNm.low },
    { key: 'mid', title: 'Most likely', hex: colour.hex, name: colour.name, nm: thicknessNm.mid },
    { key: 'high', title: 'Thicker end', hex: last.hex, name: last.name, nm: thicknessNm.high },
  ];
  return (
    <section className="card grid gap-4" aria-labelledby="prediction-heading" data-testid="prediction">
      <div>
        <p className="text-sm text-ash-600">{planned}</p>
        <h2 id="prediction-heading" className="text-xl">
          Predicted tint: <span data-testid="predicted-name">{colour.name}</span>
        </h2>
      </div>

      <div
        className="flex h-12 overflow-hidden rounded-md shadow-[inset_0_0_0_1px_rgb(0_0_0/0.15)]"
        role="img"
        aria-label={`Band of tints from ${first.name} to ${last.name}`}
      >
        {band.map((step) => (
          <span key={step.thicknessNm} className="flex-1" style={{ background: step.hex }} title={`${step.thicknessNm} nm, ${step.name}`} />
        ))}
      </div>

      <ul className="grid gap-2 sm:grid-cols-3" aria-label="The band's ends and middle">
        {ends.map((end) => (
          <li key={end.key} className="grid gap-1">
            <span
              className={
                end.key === 'mid' ? 'text-xs font-semibold tracking-wide text-ash-900 uppercase' : 'text-xs font-semibold tracking-wide text-ash-600 uppercase'
              }
            >
              {end.title}
            </span>
            <ColourChip hex={end.hex} label={end.name} detail={`${end.nm} nm · ${end.hex}`} />
          </li>
        ))}
      </ul>

      {prediction.argon ? (
        <p className="text-sm" data-basis="argon">
          Under argon: from {prediction.argon.couponCount} argon coupon{prediction.argon.couponCount === 1 ? '' : 's'} in the library, whose films are{' '}
          {prediction.argon.factor < 1 ? `about ${Math.round(prediction.argon.factor * 100)} % of` : `about ${prediction.argon.factor}× `} what the same heats
          give in air.
        </p>
      ) : (
        <BasisNote basis={prediction.basis} couponCount={prediction.couponCount} signedIn={signedIn} />
      )}

      <Warnings warnings={warnings} />
    </section>
  );
}
