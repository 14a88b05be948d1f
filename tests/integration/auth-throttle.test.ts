import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeSpace, makeUser, testDb, TEST_PASSWORD } from '../helpers/db';
import { SourceSession } from './auth-fixtures';

// Password attempts are throttled per e-mail AND source address with growing delays, not a lock
// (issue 11, finding 12). Sessions connect from different loopback addresses (127.0.0.x), so the app
// sees them as different sources, as it would two networks.

const db = testDb();
let spaceId: string;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const person = () => makeUser(db, spaceId, ['member']);

beforeAll(async () => {
  spaceId = (await makeSpace(db)).id;
});
afterAll(closeTestDb);

describe('someone guessing from one address', () => {
  test('cannot lock the owner out: the right password from another address gets straight in', async () => {
    const victim = await person();
    const attacker = new SourceSession('127.0.0.21');
    for (let i = 1; i <= 12; i++) await attacker.attempt(victim.email, `wrong-password-${i}`);
    // The guesser's own address is slowed down, even with the right password…
    expect(await attacker.attempt(victim.email, TEST_PASSWORD)).toEqual({ status: 401, error: 'TooManyAttempts' });
    // …the owner, elsewhere, is not.
    const owner = new SourceSession('127.0.0.22');
    expect(await owner.attempt(victim.email, TEST_PASSWORD)).toEqual({ status: 200, error: null });
  });

  test('delays grow with each failure and then pass: a wait, not a lock', async () => {
    const user = await person();
    const s = new SourceSession('127.0.0.23');
    // The first five failures cost nothing.
    for (let i = 1; i <= 5; i++)
      expect(await s.attempt(user.email, `wrong-${i}`), `attempt ${i}`).toEqual({ status: 401, error: 'CredentialsSignin' });
    // The sixth is still checked; after it, the next attempt must wait 1 s.
    expect(await s.attempt(user.email, 'wrong-6')).toEqual({ status: 401, error: 'CredentialsSignin' });
    expect(await s.attempt(user.email, TEST_PASSWORD)).toEqual({ status: 401, error: 'TooManyAttempts' });
    await sleep(1_100);
    // A seventh failure: now 2 s.
    expect(await s.attempt(user.email, 'wrong-7')).toEqual({ status: 401, error: 'CredentialsSignin' });
    await sleep(1_100);
    expect(await s.attempt(user.email, TEST_PASSWORD)).toEqual({ status: 401, error: 'TooManyAttempts' });
    await sleep(1_100);
    // Past the wait, the right password signs in, and the count starts again.
    expect(await s.attempt(user.email, TEST_PASSWORD)).toEqual({ status: 200, error: null });
    expect(await s.attempt(user.email, 'wrong-after')).toEqual({ status: 401, error: 'CredentialsSignin' });
    expect(await s.attempt(user.email, TEST_PASSWORD)).toEqual({ status: 200, error: null });
  });

  test('attempts refused during a wait are not counted as failures', async () => {
    const user = await person();
    const s = new SourceSession('127.0.0.24');
    for (let i = 1; i <= 6; i++) await s.attempt(user.email, `wrong-${i}`);
    for (let i = 0; i < 5; i++)
      expect(await s.attempt(user.email, 'hammering')).toEqual({ status: 401, error: 'TooManyAttempts' });
    await sleep(1_100); // still 1 s: the refused ones did not grow it
    expect(await s.attempt(user.email, TEST_PASSWORD)).toEqual({ status: 200, error: null });
  });
});

describe('one address guessing many e-mails', () => {
  test('is slowed down for every e-mail, while other addresses are not', async () => {
    const people = await Promise.all(Array.from({ length: 11 }, person));
    const sprayer = new SourceSession('127.0.0.25');
    // 55 guesses across eleven e-mails from one address, 5 per e-mail: each within its own allowance,
    // but past the address's allowance of 50.
    for (let round = 0; round < 5; round++)
      for (const p of people) await sprayer.attempt(p.email, `spray-${round}`);
    const fresh = await person();
    expect(await sprayer.attempt(fresh.email, TEST_PASSWORD)).toEqual({ status: 401, error: 'TooManyAttempts' });
    expect(await new SourceSession('127.0.0.26').attempt(fresh.email, TEST_PASSWORD)).toEqual({ status: 200, error: null });
  });
});
