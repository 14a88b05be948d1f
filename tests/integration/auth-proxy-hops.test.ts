import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeSpace, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { SourceSession } from './auth-fixtures';

// The test app runs with TRUSTED_PROXY_HOPS unset (0: no proxy in front), so the sign-in throttle counts
// the connection's own address. A guesser writing a new X-Forwarded-For on every attempt used to be a new
// source each time (the throttle took the header's last entry); now the header changes nothing.

const db = testDb();
let spaceId: string;

beforeAll(async () => {
  spaceId = (await makeSpace(db)).id;
});
afterAll(closeTestDb);

describe('X-Forwarded-For from a client with no proxy in between', () => {
  test('a fresh forged address on every guess does not escape the wait', async () => {
    const victim = await makeUser(db, spaceId, ['member']);
    const guesser = new SourceSession('127.0.0.51');
    for (let i = 1; i <= 8; i++) {
      guesser.headers = { 'x-forwarded-for': `203.0.113.${i}` };
      await guesser.attempt(victim.email, `wrong-password-${i}`);
    }
    guesser.headers = { 'x-forwarded-for': '203.0.113.99' };
    expect(await guesser.attempt(victim.email, TEST_PASSWORD)).toEqual({ status: 401, error: 'TooManyAttempts' });
  });

  test('forging the owner’s address does not slow the owner down', async () => {
    const victim = await makeUser(db, spaceId, ['member']);
    const guesser = new SourceSession('127.0.0.52');
    guesser.headers = { 'x-forwarded-for': '127.0.0.53' };
    for (let i = 1; i <= 8; i++) await guesser.attempt(victim.email, `wrong-password-${i}`);
    const owner = new SourceSession('127.0.0.53');
    expect(await owner.attempt(victim.email, TEST_PASSWORD)).toEqual({ status: 200, error: null });
  });
});
