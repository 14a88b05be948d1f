import Stripe from 'stripe';
import { AppError, ConflictError, UnavailableError } from '@/lib/errors';

/** True when the processor could not be reached at all (refused, timed out, reset). */
export function isProcessorUnreachable(err: unknown): boolean {
  return err instanceof Stripe.errors.StripeConnectionError;
}

/**
 * A processor failure as one of our typed errors: unreachable or failing on its side → 503 (try
 * again); a request it refused → 409 with its message, so the treasurer sees why.
 */
export function processorError(err: unknown, doing: string): AppError {
  if (err instanceof AppError) return err;
  if (isProcessorUnreachable(err)) {
    return new UnavailableError(
      `The card processor is not answering, so we could not ${doing}. Try again in a minute.`,
    );
  }
  if (err instanceof Stripe.errors.StripeError) {
    if ((err.statusCode ?? 500) >= 500 || err instanceof Stripe.errors.StripeAuthenticationError) {
      return new UnavailableError(
        `The card processor failed while we tried to ${doing} (${err.message}). Try again shortly.`,
      );
    }
    return new ConflictError(`The card processor refused to ${doing}: ${err.message}`);
  }
  return new UnavailableError(
    `Something went wrong talking to the card processor while we tried to ${doing}.`,
  );
}
