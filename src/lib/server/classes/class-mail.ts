import { sendMail } from '../mail';

/** The invitation e-mail: it names the class and the instructor, and says how long the link lasts. */
export function sendInvitationMail(to: string, invitation: { className: string; term: string | null; instructorName: string; link: string; days: number }) {
  const { className, term, instructorName, link, days } = invitation;
  const classLine = term ? `${className} (${term})` : className;
  return sendMail({
    to,
    subject: `${instructorName} invites you to the class “${className}” on Oxbloom`,
    text:
      `Hello,\n\n${instructorName} invites you to join the class ${classLine} on Oxbloom, where the class logs its heat-colouring coupons and compares results.\n\n` +
      `Join the class: ${link}\n\n` +
      `If you have no Oxbloom account yet, you can make one from that page with this e-mail address. The link works once and lasts ${days} days.\n` +
      `If you did not expect this invitation, ignore this message.\n`,
  });
}
