import { problem } from './http';

/** What a person is told when an e-mailed link can't be used. */
export const tokenProblems = {
  used: 'This link has already been used. Each link works once: ask for a new one.',
  expired: 'This link has expired. Ask for a new one.',
  unknown: 'This link is not valid. Check that you copied all of it, or ask for a new one.',
} as const;

export function tokenProblem(status: keyof typeof tokenProblems): Response {
  return problem(status === 'unknown' ? 400 : 410, tokenProblems[status], 'token');
}
