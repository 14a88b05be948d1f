'use client';
import type { Role } from '@/lib/domain';
import { ROLES } from '@/lib/auth/roles';
import { ROLE_WORDS } from '@/lib/people/schema';
import { InlineError } from './form-field';

/** The four roles as checkboxes in a fieldset; a person may hold several. */
export function RoleCheckboxes({
  idPrefix,
  legend,
  value,
  onChange,
  disabled,
  error,
  hideLegend,
}: {
  idPrefix: string;
  legend: string;
  value: Role[];
  onChange: (roles: Role[]) => void;
  disabled?: boolean;
  error?: string;
  hideLegend?: boolean;
}) {
  const toggle = (role: Role, on: boolean) =>
    onChange(ROLES.filter((r) => (r === role ? on : value.includes(r))));
  return (
    <fieldset
      aria-describedby={error ? `${idPrefix}-error` : undefined}
      aria-invalid={error ? true : undefined}
    >
      <legend className={hideLegend ? 'sr-only' : 'label'}>{legend}</legend>
      <div className="flex flex-wrap gap-x-3 gap-y-1">
        {ROLES.map((role) => (
          <label
            key={role}
            htmlFor={`${idPrefix}-${role}`}
            className="inline-flex min-h-8 items-center gap-1.5 text-sm"
          >
            <input
              id={`${idPrefix}-${role}`}
              type="checkbox"
              className="size-4 accent-accent"
              checked={value.includes(role)}
              disabled={disabled}
              onChange={(e) => toggle(role, e.target.checked)}
            />
            {ROLE_WORDS[role]}
          </label>
        ))}
      </div>
      {error ? <InlineError id={`${idPrefix}-error`}>{error}</InlineError> : null}
    </fieldset>
  );
}
