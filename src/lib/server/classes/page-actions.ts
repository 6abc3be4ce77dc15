import { classPatchSchema, inviteSchema } from '~/lib/classes/requests';
import { findCoupon } from '../coupons';
import { parseRouteId } from '../route-params';
import { validateForm, type FieldErrors } from '../forms';
import type { UserRecord } from '../users';
import type { ClassInHand } from './access';
import { unshareCoupon } from './class-coupons';
import { deleteClass, updateClass } from './classes';
import { inviteToClass, resendInvitation, revokeInvitation } from './invitations';
import { removeStudent } from './roster';

/** What the class page's forms (no JavaScript needed) ask for, done with the same rules as the API. */
export type PageAction = { notice?: string; errors?: FieldErrors; status?: number; redirect?: string };

const describeOutcomes = (outcomes: Awaited<ReturnType<typeof inviteToClass>>) => {
  const sent = outcomes.filter((outcome) => outcome.status === 'sent').map((outcome) => outcome.email);
  const members = outcomes.filter((outcome) => outcome.status === 'already-member').map((outcome) => outcome.email);
  const limited = outcomes.filter((outcome) => outcome.status === 'limited').map((outcome) => outcome.email);
  const yours = outcomes.some((outcome) => outcome.status === 'is-instructor');
  return [
    sent.length ? `Invitation sent to ${sent.join(', ')}.` : '',
    members.length ? `Already in the class: ${members.join(', ')}.` : '',
    limited.length ? `Not sent (too many invitations to that address this hour): ${limited.join(', ')}.` : '',
    yours ? 'You teach this class, so you need no invitation.' : '',
  ]
    .filter(Boolean)
    .join(' ');
};

export async function classPageAction(form: FormData, found: ClassInHand, user: UserRecord): Promise<PageAction> {
  const intent = form.get('intent');
  const { cls, standing } = found;
  const manager = standing === 'manager';
  if (intent === 'leave' && standing === 'student') {
    await removeStudent(cls.id, user.id);
    return { redirect: '/classes?left=1' };
  }
  if (intent === 'unshare') {
    const couponId = parseRouteId(String(form.get('couponId') ?? ''));
    // The coupon's owner or the class's managers, as the API route.
    const coupon = couponId ? await findCoupon(couponId) : undefined;
    if (coupon && (manager || coupon.ownerId === user.id) && (await unshareCoupon(cls.id, coupon.id)))
      return { notice: 'The coupon is no longer shared with the class.' };
    return { notice: 'That coupon was not shared with the class.', status: 404 };
  }
  if (!manager) return { notice: 'Only the class’s instructor may do that.', status: 403 };
  switch (intent) {
    case 'invite': {
      const input = validateForm(form, inviteSchema);
      if (!input.ok) return { errors: input.errors, status: 400 };
      return { notice: describeOutcomes(await inviteToClass(cls, user, input.data.emails)) };
    }
    case 'resend': {
      const id = parseRouteId(String(form.get('invitationId') ?? ''));
      const outcome = id ? await resendInvitation(cls, user, id) : 'not-found';
      if (outcome === 'limited') return { notice: 'Too many invitations to that address this hour. Try again later.', status: 429 };
      return outcome === 'sent'
        ? { notice: 'A new link is on its way; the old one no longer works.' }
        : { notice: 'That invitation is no longer open.', status: 404 };
    }
    case 'revoke': {
      const id = parseRouteId(String(form.get('invitationId') ?? ''));
      return id && (await revokeInvitation(cls.id, id))
        ? { notice: 'Invitation revoked: its link no longer works.' }
        : { notice: 'That invitation is no longer open.', status: 404 };
    }
    case 'remove': {
      const userId = String(form.get('userId') ?? '').slice(0, 255);
      return (await removeStudent(cls.id, userId))
        ? { notice: 'The student is removed from the class; their coupons are no longer shared with it.' }
        : { notice: 'That person is not a student of this class.', status: 404 };
    }
    case 'edit': {
      const input = validateForm(form, classPatchSchema);
      if (!input.ok) return { errors: input.errors, status: 400 };
      await updateClass(cls.id, input.data);
      return { notice: 'Class details saved.' };
    }
    case 'delete':
      await deleteClass(cls.id);
      return { redirect: '/classes?deleted=1' };
    default:
      return { notice: 'Nothing to do.', status: 400 };
  }
}
