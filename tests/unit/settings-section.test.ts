import { describe, expect, it } from 'vitest';
import { applyPatch } from '@/lib/settings/section';

describe('a settings section patch', () => {
  const before = { limit: 3, days: [1, 2], note: 'a' };
  it('applies only the fields that change, and says what each was', () => {
    expect(applyPatch(before, { limit: 4, days: [1, 2], note: undefined })).toEqual({
      after: { limit: 4, days: [1, 2], note: 'a' },
      changed: { limit: { from: 3, to: 4 } },
    });
  });
  it('compares by value, so an equal list is no change, and leaves the stored object alone', () => {
    const out = applyPatch(before, { days: [1, 2] });
    expect(out.changed).toEqual({});
    expect(applyPatch(before, { days: [2, 1] }).changed).toEqual({ days: { from: [1, 2], to: [2, 1] } });
    expect(before).toEqual({ limit: 3, days: [1, 2], note: 'a' });
  });
  it('ignores keys the section does not have', () => {
    expect(applyPatch(before, { other: 1 } as never).changed).toEqual({});
  });
});
