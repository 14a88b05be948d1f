'use client';
import { useMutation } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import type { Role } from '@/lib/domain';
import { DataTable } from '@/components/books/data-table';
import type { Person } from '@/lib/people/people';
import type { UpdatePersonInput } from '@/lib/people/schema';
import { InlineError } from './form-field';
import { RoleCheckboxes } from './role-checkboxes';
import { errorText, sendJson } from './send-json';

/** Erasure on request: asks for the person's e-mail as confirmation (POST /api/people/:id/erase). */
function EraseButton({ person }: { person: Person }) {
  const router = useRouter();
  const erase = useMutation({
    mutationFn: (confirmEmail: string) => sendJson<{ person: { name: string } }>(`/api/people/${person.id}/erase`, 'POST', { confirmEmail }),
    onSuccess: () => router.refresh(),
  });
  return (
    <>
      <button
        type="button"
        className="btn-quiet min-h-9 px-3 py-1 text-sm"
        disabled={erase.isPending}
        onClick={() => {
          const typed = window.prompt(
            `Erase ${person.name}'s personal data? Name, e-mail and sign-in are removed for good; their loans and sales stay, anonymous. Type their e-mail to confirm.`,
          );
          if (typed) erase.mutate(typed);
        }}
      >
        Erase personal data<span className="sr-only"> of {person.name}</span>
      </button>
      {erase.isError ? <InlineError alert>{errorText(erase.error)}</InlineError> : null}
    </>
  );
}

const sameRoles = (a: Role[], b: Role[]) => a.length === b.length && a.every((r) => b.includes(r));

/** One person's roles and access switch for this space, saved through PATCH /api/people/:id. */
function PersonControls({ person, isSelf }: { person: Person; isSelf: boolean }) {
  const router = useRouter();
  const [roles, setRoles] = useState<Role[]>(person.roles);
  const save = useMutation({
    mutationFn: (input: UpdatePersonInput) =>
      sendJson<{ person: Person }>(`/api/people/${person.id}`, 'PATCH', input),
    onSuccess: ({ person: saved }) => {
      setRoles(saved.roles);
      router.refresh();
    },
  });
  const changed = !sameRoles(roles, person.roles);
  return (
    <div className="space-y-2">
      <RoleCheckboxes
        idPrefix={`roles-${person.id}`}
        legend={`Roles of ${person.name}`}
        hideLegend
        value={roles}
        onChange={setRoles}
        disabled={save.isPending}
      />
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="btn-primary min-h-9 px-3 py-1 text-sm"
          disabled={!changed || roles.length === 0 || save.isPending}
          onClick={() => save.mutate({ roles })}
        >
          Save roles<span className="sr-only"> of {person.name}</span>
        </button>
        {isSelf ? null : (
          <button
            type="button"
            className={`${person.disabled ? 'btn-quiet' : 'btn-danger'} min-h-9 px-3 py-1 text-sm`}
            disabled={save.isPending}
            onClick={() => {
              // Switching access off takes effect at their next request; ask before doing it.
              if (
                !person.disabled &&
                !window.confirm(
                  `Switch off ${person.name}'s access to this space? Their other spaces are not affected.`,
                )
              )
                return;
              save.mutate({ disabled: !person.disabled });
            }}
          >
            {person.disabled ? 'Switch access on' : 'Switch access off'}
            <span className="sr-only"> of {person.name}</span>
          </button>
        )}
        {isSelf ? null : <EraseButton person={person} />}
      </div>
      {save.isError ? <InlineError alert>{errorText(save.error)}</InlineError> : null}
    </div>
  );
}

const col = createColumnHelper<Person>();

/** The space's people: dense and sortable on a laptop, scrolls sideways inside its box on a phone. */
export function PeopleTable({ people, selfId }: { people: Person[]; selfId: string }) {
  const columns = [
    col.accessor('name', {
      header: 'Name',
      cell: (c) => (
        <>
          {c.getValue()}
          {c.row.original.id === selfId ? <span className="muted"> (you)</span> : null}
        </>
      ),
    }),
    col.accessor('email', { header: 'E-mail' }),
    col.accessor('disabled', {
      header: 'Access here',
      cell: (c) =>
        c.getValue() ? (
          <span className="inline-block rounded-md border border-red-700 px-2 py-0.5 text-xs font-semibold text-red-900 dark:text-red-200">
            off
          </span>
        ) : (
          <span className="inline-block rounded-md border border-green-700 px-2 py-0.5 text-xs font-semibold text-green-900 dark:text-green-200">
            on
          </span>
        ),
    }),
    col.display({
      id: 'roles',
      header: 'Roles in this space',
      cell: (c) => (
        <PersonControls
          key={c.row.original.roles.join()}
          person={c.row.original}
          isSelf={c.row.original.id === selfId}
        />
      ),
    }),
  ];
  // The books' generic TanStack table serves here too (one sortable dense table in the product).
  return (
    <DataTable
      data={people}
      columns={columns}
      caption="People in this space"
      empty="Nobody is in this space yet."
      rowKey={(p) => p.id}
      rowAttrs={(p) => ({ 'data-person': p.email })}
    />
  );
}
