'use client';

import { useActionState } from 'react';
import { createFeedstockAction, mergeFeedstockAction, renameFeedstockAction } from '@/app/feedstocks/actions';
import { fieldError, FormMessage } from '@/components/forms/form-message';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import type { ActionState } from '@/lib/errors';

const selectClass = 'min-h-touch w-full rounded-md border border-line-strong bg-surface-raised px-3 text-base text-ink';

function Select({
  label,
  name,
  id,
  options,
  error,
  defaultValue,
}: {
  label: string;
  name: string;
  id: string;
  options: { value: string; label: string }[];
  error?: string;
  defaultValue?: string;
}) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-semibold">
        {label}
      </label>
      <select
        id={id}
        name={name}
        defaultValue={defaultValue}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className={selectClass}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      {error ? (
        <p id={`${id}-error`} className="text-sm font-semibold text-danger">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** A new feedstock (editors). */
export function CreateFeedstockForm({
  categories,
  cautions,
  defaultName,
  requestId,
}: {
  categories: { value: string; label: string }[];
  cautions: { value: string; label: string }[];
  defaultName?: string;
  requestId?: number;
}) {
  const [state, action, pending] = useActionState<ActionState, FormData>(createFeedstockAction, { ok: false });
  return (
    <form action={action} className="max-w-prose space-y-4" noValidate>
      {requestId ? <input type="hidden" name="requestId" value={requestId} /> : null}
      <FormMessage state={state} />
      <Field label="Name" name="name" id="create-name" required defaultValue={defaultName} error={fieldError(state, 'name')} maxLength={160} />
      <Field
        label="Address"
        name="slug"
        id="create-slug"
        hint="Optional: made from the name when left empty (lower-case words and hyphens)."
        error={fieldError(state, 'slug')}
        maxLength={120}
      />
      <Select label="Category" name="category" id="create-category" options={categories} error={fieldError(state, 'category')} />
      <Field label="Family" name="family" id="create-family" hint="Groups related feedstocks, e.g. “citrus” or “allium”." error={fieldError(state, 'family')} maxLength={80} />
      <Field label="Other names" name="aliases" id="create-aliases" hint="Separated by commas, e.g. “orange rind, citrus peel”." error={fieldError(state, 'aliases')} />
      <Field label="One-line summary" name="summary" id="create-summary" error={fieldError(state, 'summary')} maxLength={500} />
      <fieldset className="space-y-1">
        <legend className="font-semibold">Handling cautions for people</legend>
        {cautions.map((c) => (
          <label key={c.value} className="flex min-h-touch items-center gap-2">
            <input type="checkbox" name="handlingCautions" value={c.value} className="size-5" />
            {c.label}
          </label>
        ))}
      </fieldset>
      <div className="flex flex-col gap-1">
        <label htmlFor="create-text" className="font-semibold">
          Page text <span className="font-normal text-ink-muted">(markdown, optional)</span>
        </label>
        <textarea id="create-text" name="pageText" rows={6} className="w-full rounded-md border border-line-strong bg-surface-raised p-3 font-mono text-sm" />
      </div>
      <Button type="submit" disabled={pending}>
        {pending ? 'Creating…' : 'Create the feedstock'}
      </Button>
    </form>
  );
}

/** Rename a feedstock or move it to a new address (editors); the old address keeps working. */
export function RenameFeedstockForm({ feedstockId, name, slug }: { feedstockId: number; name: string; slug: string }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(renameFeedstockAction, { ok: false });
  return (
    <form action={action} className="space-y-4" noValidate aria-labelledby="rename-heading">
      <input type="hidden" name="feedstockId" value={feedstockId} />
      <h2 id="rename-heading" className="text-xl">
        Rename or move
      </h2>
      <FormMessage state={state} />
      <Field label="Name" name="name" id="rename-name" defaultValue={name} required error={fieldError(state, 'name')} maxLength={160} />
      <Field label="Address" name="slug" id="rename-slug" defaultValue={slug} required hint="The old address will redirect here." error={fieldError(state, 'slug')} maxLength={120} />
      <Button type="submit" disabled={pending}>
        {pending ? 'Saving…' : 'Save the new name'}
      </Button>
    </form>
  );
}

/** Merge this feedstock into another (editors). */
export function MergeFeedstockForm({ feedstockId, name, choices }: { feedstockId: number; name: string; choices: { value: string; label: string }[] }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(mergeFeedstockAction, { ok: false });
  return (
    <form action={action} className="space-y-4" noValidate aria-labelledby="merge-heading">
      <input type="hidden" name="sourceId" value={feedstockId} />
      <h2 id="merge-heading" className="text-xl">
        Merge into another feedstock
      </h2>
      <p>
        Trials, other names, proposals and subscribers of {name.toLowerCase()} move to the feedstock you choose, and this page&rsquo;s address
        redirects there. Its text history stays for the record. This cannot be undone from here.
      </p>
      <FormMessage state={state} />
      <Select label="Merge into" name="targetId" id="merge-target" options={[{ value: '', label: 'Choose a feedstock' }, ...choices]} error={fieldError(state, 'targetId')} />
      <Field label="Why (for the audit log)" name="note" id="merge-note" maxLength={1000} error={fieldError(state, 'note')} />
      <Button type="submit" variant="danger" disabled={pending}>
        {pending ? 'Merging…' : 'Merge'}
      </Button>
    </form>
  );
}
