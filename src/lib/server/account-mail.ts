import { sendMail } from './mail';

/** The account e-mails. Plain words; every link is single-use and says how long it lasts. */

export function sendVerificationMail(to: string, name: string, link: string) {
  return sendMail({
    to,
    subject: 'Confirm your e-mail address for Oxbloom',
    text: `Hello ${name},\n\nConfirm your e-mail address to finish setting up your Oxbloom account:\n\n${link}\n\nThe link works once and lasts 24 hours. If you did not sign up, ignore this message.\n`,
  });
}

export function sendAlreadyRegisteredMail(to: string, signInLink: string, resetLink: string) {
  return sendMail({
    to,
    subject: 'Someone tried to sign up to Oxbloom with your address',
    text: `Someone (perhaps you) tried to make a new Oxbloom account with this e-mail address, which already has one.\n\nSign in: ${signInLink}\nForgot your password? ${resetLink}\n\nIf it was not you, you need do nothing.\n`,
  });
}

export function sendResetMail(to: string, link: string) {
  return sendMail({
    to,
    subject: 'Reset your Oxbloom password',
    text: `Choose a new password for your Oxbloom account:\n\n${link}\n\nThe link works once and lasts one hour. If you did not ask for it, ignore this message; your password is unchanged.\n`,
  });
}

export function sendNoAccountMail(to: string, signUpLink: string) {
  return sendMail({
    to,
    subject: 'No Oxbloom account for this address',
    text: `Someone (perhaps you) asked for an Oxbloom sign-in or password link for this e-mail address, but it has no account.\n\nTo make one: ${signUpLink}\n\nIf it was not you, you need do nothing.\n`,
  });
}

export function sendSignInLinkMail(to: string, link: string) {
  return sendMail({
    to,
    subject: 'Your Oxbloom sign-in link',
    text: `Sign in to Oxbloom with this link:\n\n${link}\n\nThe link works once and lasts 15 minutes. If you did not ask for it, ignore this message.\n`,
    html: `<p>Sign in to Oxbloom with this link:</p><p><a href="${link}">Sign in to Oxbloom</a></p><p>The link works once and lasts 15 minutes. If you did not ask for it, ignore this message.</p>`,
  });
}
