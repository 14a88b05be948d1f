import { describe, expect, test } from 'vitest';
import { auditLine } from '@/lib/loans/audit-words';

// The loans audit trail names the thing and the person, and shows dates in the space's own time zone
// (issue 12: a loan due 16 Dec 21:00 in Chicago showed as "due 2026-12-17"; seeded rows ended in "due").
const CHICAGO = 'America/Chicago';

describe('auditLine', () => {
  test('a new loan: the box, the borrower, and the due date in local time, not the UTC date', () => {
    const line = auditLine(
      {
        action: 'loan.created',
        thing: 'Reading lamp box 1',
        person: 'Ada Lindqvist',
        detail: { verdict: 'ok', onBehalf: true, dueAt: '2026-12-17T03:00:00.000Z' },
      },
      CHICAGO,
    );
    expect(line).toBe(
      'Reading lamp box 1 to Ada Lindqvist · check ok · lent by a steward · due 16 Dec 2026, 21:00',
    );
    expect(line).not.toContain('2026-12-17');
  });

  test('a seeded row without a due date does not end in a bare "due"', () => {
    const line = auditLine(
      { action: 'loan.created', person: 'Ada Lindqvist', detail: { box: 'Desk lamp box 2', verdict: 'ok' } },
      CHICAGO,
    );
    expect(line).toBe('Desk lamp box 2 to Ada Lindqvist · check ok');
    expect(line).not.toMatch(/\bdue\s*$/);
  });

  test('a short return says what was missing or damaged, and the note', () => {
    const line = auditLine(
      {
        action: 'loan.returned',
        thing: 'Reading lamp box 1',
        person: 'Ada Lindqvist',
        detail: {
          status: 'returned_short',
          lines: [
            { part: 'Warm white LED star', qty: 3, returned: 2, condition: 'missing' },
            { part: 'Driver 350 mA', qty: 1, returned: 1, condition: 'ok' },
          ],
          note: 'lost on the bus',
        },
      },
      CHICAGO,
    );
    expect(line).toBe(
      'Reading lamp box 1 from Ada Lindqvist · back short · 1 × Warm white LED star missing · note “lost on the bus”',
    );
  });

  test('a renewal shows the new due date locally; box upkeep names the box and the unit', () => {
    expect(
      auditLine(
        {
          action: 'loan.renewed',
          thing: 'Meter',
          person: 'Ada Lindqvist',
          detail: { to: '2026-12-24T03:00:00.000Z' },
        },
        CHICAGO,
      ),
    ).toBe('Meter for Ada Lindqvist · now due 23 Dec 2026, 21:00');
    expect(
      auditLine(
        {
          action: 'kit_box.unit_swapped',
          thing: 'Reading lamp box 1',
          detail: {
            removed: 'Driver (K7F2QX9)',
            to: 'to repair',
            replacement: 'Driver (M3P8RT2)',
            reason: 'hums',
          },
        },
        CHICAGO,
      ),
    ).toBe('Reading lamp box 1 · Driver (K7F2QX9) to repair · in its place Driver (M3P8RT2) · “hums”');
  });
});
