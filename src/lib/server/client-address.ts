import type { APIContext } from 'astro';
import { config } from './config';

/**
 * The client's address. Behind a load balancer set TRUST_PROXY=1 so the left-most
 * X-Forwarded-For entry is used; otherwise the socket's address.
 */
export function clientAddress(context: Pick<APIContext, 'request' | 'clientAddress'>): string {
  if (config().TRUST_PROXY) {
    const forwarded = context.request.headers.get('x-forwarded-for')?.split(',')[0]?.trim();
    if (forwarded) return forwarded;
  }
  try {
    return context.clientAddress;
  } catch {
    return 'unknown';
  }
}
