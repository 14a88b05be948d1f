'use client';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import type { PartCategory } from '@/lib/domain';
import { CATEGORIES, CATEGORY_WORDS } from '@/lib/inventory/words';
import { FormNote } from '@/components/people/form-field';
import { ApiError, errorText, sendJson } from '@/components/people/send-json';

type Existing = { id: string; name: string; description: string; templateIds: string[]; categories: PartCategory[]; archived: boolean };

/** Defines an induction, or (with `existing`) changes one, behind a "Change" disclosure. */
export function InductionForm({ existing, templates }: { existing?: Existing; templates: { id: string; name: string }[] }) {
  const router = useRouter();
  const ids = useId();
  const [name, setName] = useState(existing?.name ?? '');
  const [description, setDescription] = useState(existing?.description ?? '');
  const [templateIds, setTemplateIds] = useState<string[]>(existing?.templateIds ?? []);
  const [categories, setCategories] = useState<PartCategory[]>(existing?.categories ?? []);
  const [archived, setArchived] = useState(existing?.archived ?? false);
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const toggle = <T,>(list: T[], v: T, on: boolean) => (on ? [...list, v] : list.filter((x) => x !== v));

  const form = (
    <form
      className="space-y-3"
      noValidate
      aria-label={existing ? `Change ${existing.name}` : 'Define an induction'}
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setMsg(null);
        setFields({});
        try {
          const body = { name, description, templateIds, categories, ...(existing ? { archived } : {}) };
          await sendJson(existing ? `/api/inductions/${existing.id}` : '/api/inductions', existing ? 'PATCH' : 'POST', body);
          setMsg({ kind: 'ok', text: existing ? 'Saved.' : `“${name}” is defined.` });
          if (!existing) {
            setName('');
            setDescription('');
            setTemplateIds([]);
            setCategories([]);
          }
          router.refresh();
        } catch (err) {
          if (err instanceof ApiError) setFields(err.fields);
          setMsg({ kind: 'error', text: errorText(err) });
        } finally {
          setBusy(false);
        }
      }}
    >
      <div>
        <label className="label" htmlFor={`${ids}-name`}>
          Name, in your own words
        </label>
        <input id={`${ids}-name`} className="field" value={name} maxLength={80} onChange={(e) => setName(e.target.value)} />
        {fields.name ? <p className="text-sm text-red-800 dark:text-red-300">{fields.name.join('; ')}</p> : null}
      </div>
      <div>
        <label className="label" htmlFor={`${ids}-desc`}>
          What is shown
        </label>
        <textarea id={`${ids}-desc`} className="field" rows={2} value={description} onChange={(e) => setDescription(e.target.value)} />
      </div>
      {templates.length ? (
        <fieldset>
          <legend className="label">Kits that need it</legend>
          <div className="flex flex-wrap gap-x-4 gap-y-1">
            {templates.map((t) => (
              <label key={t.id} className="flex items-center gap-2">
                <input
                  type="checkbox"
                  className="size-5"
                  checked={templateIds.includes(t.id)}
                  onChange={(e) => setTemplateIds(toggle(templateIds, t.id, e.target.checked))}
                />
                <span className="break-words">{t.name}</span>
              </label>
            ))}
          </div>
        </fieldset>
      ) : null}
      <fieldset>
        <legend className="label">Parts that need it, loose or in a kit</legend>
        <div className="flex flex-wrap gap-x-4 gap-y-1">
          {CATEGORIES.map((c) => (
            <label key={c} className="flex items-center gap-2">
              <input
                type="checkbox"
                className="size-5"
                checked={categories.includes(c)}
                onChange={(e) => setCategories(toggle(categories, c, e.target.checked))}
              />
              {CATEGORY_WORDS[c]}
            </label>
          ))}
        </div>
      </fieldset>
      {existing ? (
        <label className="flex items-center gap-2">
          <input type="checkbox" className="size-5" checked={archived} onChange={(e) => setArchived(e.target.checked)} />
          Archived (no longer asked for)
        </label>
      ) : null}
      {msg ? <FormNote kind={msg.kind}>{msg.text}</FormNote> : null}
      <button type="submit" className="btn-primary" disabled={busy || !name.trim()}>
        {busy ? 'Saving…' : existing ? 'Save changes' : 'Define it'}
      </button>
    </form>
  );
  if (!existing) return form;
  return (
    <details className="mt-1">
      <summary className="cursor-pointer text-sm font-semibold">Change</summary>
      <div className="mt-2">{form}</div>
    </details>
  );
}
