import { problem } from './http';

/** A request refused for a reason the person can act on: a 4xx with its message (and the field at fault). */
export class Refused extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly field?: string,
  ) {
    super(message);
    this.name = 'Refused';
  }
}

/** The response for a Refused error; anything else is thrown on. */
export function refusalResponse(error: unknown): Response {
  if (error instanceof Refused) return problem(error.status, error.message, error.field);
  throw error;
}
