'use client';

import { useActionState, useDeferredValue, useState } from 'react';
import { submitPageEditAction, type EditFormState } from '@/app/feedstocks/actions';
import { fieldError, FormMessage } from '@/components/forms/form-message';
import { PageText } from '@/components/markdown/page-text';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';

export type PageEditFormProps = {
  feedstockId: number;
  initialText: string;
  /** The text version this edit starts from (optimistic lock). */
  baseVersion: number;
  /** Editors publish; contributors suggest. */
  mode: 'publish' | 'suggest';
};

/**
 * Page-text editor with a live preview through the same sanitised renderer
 * the page uses. The text is held in state, so a refused save (a conflict,
 * a field error) never loses what was typed.
 */
export function PageEditForm({ feedstockId, initialText, baseVersion, mode }: PageEditFormProps) {
  const [text, setText] = useState(initialText);
  const preview = useDeferredValue(text);
  const [state, action, pending] = useActionState<EditFormState, FormData>(submitPageEditAction, { ok: false });
  const bodyError = fieldError(state, 'body');
  const done = state.ok && state.status === 'pending';

  return (
    <form action={action} className="space-y-4" noValidate>
      <input type="hidden" name="feedstockId" value={feedstockId} />
      <input type="hidden" name="baseVersion" value={baseVersion} />
      <FormMessage state={state} />
      {!state.ok && state.message && /changed while you were editing/.test(state.message) ? (
        <p className="text-sm">Your text is still in the box below. Copy it before you reload the page.</p>
      ) : null}
      <div className="grid gap-6 lg:grid-cols-2">
        <div className="flex flex-col gap-1">
          <label htmlFor="edit-body" className="font-semibold">
            Page text
          </label>
          <p id="edit-body-hint" className="text-sm text-ink-muted">
            Markdown: blank line between paragraphs, <code>## Heading</code>, <code>- list item</code>, <code>**bold**</code>,{' '}
            <code>[link](https://…)</code>. HTML and images are not shown.
          </p>
          <textarea
            id="edit-body"
            name="body"
            value={text}
            onChange={(e) => setText(e.target.value)}
            rows={18}
            maxLength={60000}
            required
            aria-invalid={bodyError ? true : undefined}
            aria-describedby={bodyError ? 'edit-body-hint edit-body-error' : 'edit-body-hint'}
            className="w-full rounded-md border border-line-strong bg-surface-raised p-3 font-mono text-sm text-ink"
          />
          {bodyError ? (
            <p id="edit-body-error" className="text-sm font-semibold text-danger">
              {bodyError}
            </p>
          ) : null}
        </div>
        <section aria-labelledby="preview-heading" className="rounded-lg border border-dashed border-line-strong bg-surface-raised p-4">
          <h2 id="preview-heading" className="mb-3 text-lg text-ink-muted">
            Preview
          </h2>
          <PageText source={preview} />
        </section>
      </div>
      <Field
        label="What did you change?"
        name="editSummary"
        id="edit-summary"
        maxLength={255}
        hint="A few words for the history, e.g. “Added soaking advice”."
        error={fieldError(state, 'editSummary')}
      />
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending || done}>
          {pending ? 'Saving…' : mode === 'publish' ? 'Publish' : 'Send for review'}
        </Button>
        <span className="text-sm text-ink-muted">
          {mode === 'publish' ? 'Editors publish straight away.' : 'An editor reviews suggested edits before they appear.'}
        </span>
      </div>
    </form>
  );
}
