// Test card numbers the hosted pay page understands. Anything else is refused as an unknown number,
// so a real card number typed by mistake is never "charged" even pretend-wise.
export type CardOutcome =
  | { kind: 'success'; brand: string; last4: string }
  | { kind: 'declined'; brand: string; last4: string; declineCode: string; message: string };

const CARDS: Record<string, CardOutcome> = {
  '4242424242424242': { kind: 'success', brand: 'visa', last4: '4242' },
  '4000000000000002': {
    kind: 'declined',
    brand: 'visa',
    last4: '0002',
    declineCode: 'generic_decline',
    message: 'Your card was declined.',
  },
  '4000000000009995': {
    kind: 'declined',
    brand: 'visa',
    last4: '9995',
    declineCode: 'insufficient_funds',
    message: 'Your card has insufficient funds.',
  },
};

export const SUCCESS_CARD = '4242 4242 4242 4242';
export const DECLINE_CARD = '4000 0000 0000 0002';

/** Spaces and dashes are ignored, as on a printed card. */
export function cardOutcome(number: string): CardOutcome | undefined {
  return CARDS[number.replace(/[\s-]/g, '')];
}
