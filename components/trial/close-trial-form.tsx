'use client';

import { startTransition, useActionState, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { zodFieldErrors, type ActionState, type FieldErrors } from '@/lib/errors';
import { closeInputFromForm, TrialCloseSchema } from '@/lib/validation/trials';
import { controlId, ErrorSummary, TextareaField } from './form-controls';
import { OUTCOME_DESCRIPTIONS, OUTCOME_LABELS, OUTCOMES, type Outcome } from './vocabulary';

type State = ActionState & { values?: Record<string, string | string[]> };

/**
 * Closing a trial: the engine's proposed outcome is preselected; the owner
 * confirms it, or picks another and says why, or abandons the trial (no
 * outcome; it stays in the evidence as censored).
 */
export function CloseTrialForm({ trialId, proposed, action }: { trialId: number; proposed: Outcome | null; action: (prev: State, formData: FormData) => Promise<State> }) {
  const [state, dispatch, pending] = useActionState(action, { ok: false });
  const [choice, setChoice] = useState<string>(proposed ?? '');
  const [status, setStatus] = useState<'closed' | 'abandoned'>('closed');
  const [clientErrors, setClientErrors] = useState<FieldErrors | null>(null);
  const errors = clientErrors ?? state.fieldErrors ?? {};
  const correcting = status === 'closed' && choice !== '' && choice !== proposed;

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formData = new FormData(e.currentTarget);
    const input = closeInputFromForm(formData);
    const parsed = TrialCloseSchema.safeParse(input);
    const found: FieldErrors = parsed.success ? {} : zodFieldErrors(parsed.error);
    if (status === 'closed' && !choice) found.outcome = ['The check-ins do not settle an outcome; choose one.'];
    if (correcting && String(input.reason).length < 5) found.reason = ['Say why you are correcting the proposed outcome.'];
    if (Object.keys(found).length) {
      setClientErrors(found);
      requestAnimationFrame(() => document.getElementById(controlId(Object.keys(found)[0]))?.focus());
      return;
    }
    setClientErrors(null);
    startTransition(() => dispatch(formData));
  }

  if (state.ok) return <p role="status" className="font-semibold">{state.message}</p>;

  return (
    <form action={dispatch} onSubmit={onSubmit} noValidate className="space-y-5">
      <input type="hidden" name="trialId" value={trialId} />
      <ErrorSummary errors={errors} labels={{ outcome: 'Outcome', reason: 'Reason', status: 'Close or abandon' }} message={!clientErrors && !state.ok ? state.message : undefined} />
      <p>
        {proposed ? (
          <>
            From the check-ins, the outcome is <strong>{OUTCOME_LABELS[proposed]}</strong>: {OUTCOME_DESCRIPTIONS[proposed]}
          </>
        ) : (
          'The check-ins do not settle an outcome yet; choose one if you close the trial now.'
        )}
      </p>
      <fieldset className="space-y-2">
        <legend className="font-semibold">Close or abandon</legend>
        <label className="flex min-h-touch items-center gap-3">
          <input type="radio" name="status" value="closed" checked={status === 'closed'} onChange={() => setStatus('closed')} className="size-5 accent-accent" />
          Close the trial with an outcome
        </label>
        <label className="flex min-h-touch items-center gap-3">
          <input type="radio" name="status" value="abandoned" checked={status === 'abandoned'} onChange={() => setStatus('abandoned')} className="size-5 accent-accent" />
          Abandon it (no outcome; the bed was disturbed, or the trial could not go on)
        </label>
      </fieldset>
      {status === 'closed' ? (
        <fieldset className="space-y-2" id={controlId('outcome')} tabIndex={-1}>
          <legend className="font-semibold">Outcome</legend>
          {OUTCOMES.map((o) => (
            <label key={o} className="flex min-h-touch cursor-pointer items-start gap-3 rounded-md border border-line p-2 has-[:checked]:border-accent has-[:checked]:bg-accent-soft">
              <input type="radio" name="outcome" value={o} checked={choice === o} onChange={() => setChoice(o)} className="mt-1 size-5 accent-accent" />
              <span>
                <span className="font-semibold">{OUTCOME_LABELS[o]}</span>
                {o === proposed ? <span className="text-ink-muted"> — proposed from the check-ins</span> : null}
                <span className="block text-sm text-ink-muted">{OUTCOME_DESCRIPTIONS[o]}</span>
              </span>
            </label>
          ))}
          {errors.outcome ? <p className="text-sm font-semibold text-danger">{errors.outcome[0]}</p> : null}
        </fieldset>
      ) : null}
      <TextareaField
        label={correcting ? 'Why a different outcome? (required)' : 'Note (optional)'}
        name="reason"
        rows={3}
        error={errors.reason?.[0]}
        hint={correcting ? 'Readers see this next to the outcome, e.g. “worms moved in after the last check-in”.' : undefined}
      />
      <Button type="submit" disabled={pending}>
        {pending ? 'Saving…' : status === 'closed' ? 'Close the trial' : 'Abandon the trial'}
      </Button>
    </form>
  );
}
