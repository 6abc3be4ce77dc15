interface Props {
  basis: 'library' | 'reference';
  couponCount: number;
  signedIn: boolean;
  /** Whose prediction this is, when there are several (a laminate's layers). */
  subject?: string;
}

/** Says which data a prediction rests on: the library fit and its coupons, or reference data alone. */
export function BasisNote({ basis, couponCount, signedIn, subject }: Props) {
  const prefix = subject ? `${subject}: ` : '';
  const from = subject ? 'from' : 'From';
  if (basis === 'library') {
    return (
      <p className="text-sm" data-basis="library">
        {prefix}
        {from} {couponCount} library coupon{couponCount === 1 ? '' : 's'}, fitted to the oxide growth model.
      </p>
    );
  }
  return (
    <p className="text-sm" data-basis="reference">
      {prefix}
      {from} reference data only (published growth rates, so the band is wide).{' '}
      {signedIn ? (
        'Your library has too few coupons with swatches of this alloy to fit it yet.'
      ) : (
        <>
          <a href="/sign-in?callbackUrl=/heat-planner">Sign in</a> to use the library's coupons.
        </>
      )}
    </p>
  );
}
