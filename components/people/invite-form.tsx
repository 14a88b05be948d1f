'use client';
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import type { z } from 'zod';
import { inviteSchema } from '@/lib/people/schema';
import { describedBy, FormField, FormNote } from './form-field';
import { RoleCheckboxes } from './role-checkboxes';
import { applyFieldErrors, errorText, sendJson } from './send-json';

type In = z.input<typeof inviteSchema>;
type Out = z.output<typeof inviteSchema>;
const FIELDS = ['name', 'email', 'roles'] as const;

/** Invite someone by e-mail; they choose a password from the link (valid 7 days). */
export function InviteForm({ spaceName }: { spaceName: string }) {
  const router = useRouter();
  const [note, setNote] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const {
    register,
    control,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<In, unknown, Out>({
    resolver: zodResolver(inviteSchema),
    defaultValues: { name: '', email: '', roles: ['member'] },
  });

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      await sendJson('/api/invitations', 'POST', input);
      reset();
      setNote({ kind: 'ok', text: `Invitation sent to ${input.email}.` });
      router.refresh();
    } catch (err) {
      const unplaced = applyFieldErrors(err, setError, FIELDS);
      setNote({ kind: 'error', text: [errorText(err), ...unplaced].join(' ') });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField id="invite-name" label="Name" error={errors.name?.message}>
          <input
            {...register('name')}
            {...describedBy('invite-name', errors.name?.message)}
            className="field"
            autoComplete="off"
          />
        </FormField>
        <FormField id="invite-email" label="E-mail" error={errors.email?.message}>
          <input
            {...register('email')}
            {...describedBy('invite-email', errors.email?.message)}
            type="email"
            className="field"
            autoComplete="off"
          />
        </FormField>
      </div>
      <Controller
        control={control}
        name="roles"
        render={({ field }) => (
          <RoleCheckboxes
            idPrefix="invite-roles"
            legend={`Roles in ${spaceName}`}
            value={field.value ?? []}
            onChange={field.onChange}
            error={errors.roles?.message}
          />
        )}
      />
      {note ? <FormNote kind={note.kind}>{note.text}</FormNote> : null}
      <button type="submit" className="btn-primary" disabled={isSubmitting}>
        {isSubmitting ? 'Sending…' : 'Send invitation'}
      </button>
    </form>
  );
}
