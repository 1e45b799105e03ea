'use client';

import { useRouter } from 'next/navigation';
import { useRef, useState, useTransition, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { zodFieldErrors, type ActionState, type FieldErrors } from '@/lib/errors';
import { CheckInCreateSchema, checkInInputFromForm } from '@/lib/validation/trials';
import { CheckboxField, controlId, ErrorSummary, optionsFromLabels, SelectField, TextareaField } from './form-controls';
import { PhotoInput, UploadList, usePhotoUploads } from './photo-uploads';
import { ACTIVITY_LABELS, ACTIVITY_LEVELS, MOISTURE_LABELS, PEST_LABELS, SMELL_LABELS } from './vocabulary';

type State = ActionState & { values?: Record<string, string | string[]>; id?: number };

export type CheckInFormProps = {
  trialId: number;
  startDate: string;
  /** Today's date (UTC) from the server, as the default check-in date. */
  today: string;
  action: (prev: State, formData: FormData) => Promise<State>;
};

const LABELS: Record<string, string> = {
  observedOn: 'Date',
  wormActivity: 'Worms in the feed',
  shareRemainingPct: 'Share remaining',
  'bedTemp.value': 'Bed temperature',
  ph: 'pH',
  pests: 'Pests',
  notes: 'Notes',
};
const SHARE_PRESETS = [100, 75, 50, 25, 10, 0];

/**
 * A check-in, sized for a phone in the garden: big choices, the camera as the
 * photo source. Checked with the shared zod schema before sending; after the
 * check-in is saved its photos go up one by one with progress bars, then the
 * page refreshes. Nothing typed is lost on an error.
 */
export function CheckInForm({ trialId, startDate, today, action }: CheckInFormProps) {
  const router = useRouter();
  const formRef = useRef<HTMLFormElement>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [message, setMessage] = useState<string | undefined>();
  const [saved, setSaved] = useState<string | null>(null);
  const [files, setFiles] = useState<File[]>([]);
  const [fileInputKey, setFileInputKey] = useState(0);
  const [pending, startTransition] = useTransition();
  const uploads = usePhotoUploads();
  const err = (name: string) => errors[name]?.[0];

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formData = new FormData(e.currentTarget);
    formData.set('utcOffsetMinutes', String(-new Date().getTimezoneOffset()));
    formData.delete('photos');
    const parsed = CheckInCreateSchema.safeParse(checkInInputFromForm(formData));
    const found: FieldErrors = parsed.success ? {} : zodFieldErrors(parsed.error);
    const observedOn = String(formData.get('observedOn') ?? '');
    if (parsed.success && observedOn < startDate) found.observedOn = [`A check-in cannot be before the trial started (${startDate}).`];
    if (Object.keys(found).length) {
      setErrors(found);
      setMessage(undefined);
      requestAnimationFrame(() => document.getElementById(controlId(Object.keys(found)[0]))?.focus());
      return;
    }
    setErrors({});
    setSaved(null);
    startTransition(async () => {
      const result = await action({ ok: false }, formData);
      if (!result.ok || !result.id) {
        setErrors(result.fieldErrors ?? {});
        setMessage(result.message);
        return;
      }
      setMessage(undefined);
      let note = 'Check-in saved.';
      if (files.length) {
        const ok = await uploads.upload(files, `/api/trials/${trialId}/photos?checkInId=${result.id}`);
        note = `Check-in saved with ${ok} of ${files.length} photo${files.length === 1 ? '' : 's'}.`;
      }
      formRef.current?.reset();
      setFiles([]);
      setFileInputKey((k) => k + 1);
      setSaved(note);
      router.refresh();
    });
  }

  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className="space-y-6">
      <input type="hidden" name="trialId" value={trialId} />
      <ErrorSummary errors={errors} labels={LABELS} message={message} />
      <Field label="Date" name="observedOn" id={controlId('observedOn')} type="date" required defaultValue={today} min={startDate} error={err('observedOn')} />

      <fieldset className="space-y-2" id={controlId('wormActivity')} tabIndex={-1}>
        <legend className="font-semibold">
          Worms in the feed <span className="font-normal text-ink-muted">(required)</span>
        </legend>
        <div className="grid grid-cols-2 gap-2 sm:grid-cols-4">
          {ACTIVITY_LEVELS.map((a) => (
            <label key={a} className="flex min-h-12 cursor-pointer items-center gap-2 rounded-lg border border-line-strong bg-surface-raised px-3 has-[:checked]:border-2 has-[:checked]:border-accent has-[:checked]:bg-accent-soft">
              <input type="radio" name="wormActivity" value={a} className="size-5 accent-accent" />
              {ACTIVITY_LABELS[a]}
            </label>
          ))}
        </div>
        {err('wormActivity') ? <p className="text-sm font-semibold text-danger">{err('wormActivity')}</p> : null}
      </fieldset>

      <div className="space-y-2">
        <Field
          label="Share of the dose still there (%)"
          name="shareRemainingPct"
          id={controlId('shareRemainingPct')}
          type="number"
          inputMode="decimal"
          min={0}
          max={100}
          step="any"
          required
          error={err('shareRemainingPct')}
          hint="0 means all gone, 100 means untouched."
        />
        <div className="flex flex-wrap gap-2" aria-label="Quick picks for share remaining" role="group">
          {SHARE_PRESETS.map((p) => (
            <Button
              key={p}
              variant="secondary"
              className="min-w-14"
              onClick={() => {
                const input = document.getElementById(controlId('shareRemainingPct')) as HTMLInputElement | null;
                if (input) input.value = String(p);
              }}
            >
              {p}%
            </Button>
          ))}
        </div>
      </div>

      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 font-semibold">Bed temperature</legend>
        <p id={`${controlId('bedTemp.value')}-hint`} className="text-sm text-ink-muted">
          At 5–10 cm deep, if you measured it. Optional.
        </p>
        <div className="flex gap-2">
          <label htmlFor={controlId('bedTemp.value')} className="sr-only">
            Bed temperature
          </label>
          <input
            id={controlId('bedTemp.value')}
            name="bedTemp.value"
            type="text"
            inputMode="decimal"
            aria-describedby={`${controlId('bedTemp.value')}-hint`}
            aria-invalid={err('bedTemp.value') ? true : undefined}
            className="min-h-touch min-w-0 flex-1 rounded-md border border-line-strong bg-surface-raised px-3"
          />
          <label htmlFor={controlId('bedTemp.unit')} className="sr-only">
            Temperature unit
          </label>
          <select id={controlId('bedTemp.unit')} name="bedTemp.unit" defaultValue="C" className="min-h-touch rounded-md border border-line-strong bg-surface-raised px-3">
            <option value="C">°C</option>
            <option value="F">°F</option>
          </select>
        </div>
        {err('bedTemp.value') ? <p className="text-sm font-semibold text-danger">{err('bedTemp.value')}</p> : null}
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-3">
        <SelectField label="Smell" name="smell" options={optionsFromLabels(SMELL_LABELS)} defaultValue="earthy" />
        <SelectField label="Moisture" name="moisture" options={optionsFromLabels(MOISTURE_LABELS)} defaultValue="damp" />
        <Field label="pH" name="ph" id={controlId('ph')} inputMode="decimal" hint="Of a 1:5 slurry with water. Optional." error={err('ph')} />
      </div>

      <fieldset className="space-y-1">
        <legend className="font-semibold">What you saw</legend>
        <div className="grid gap-x-4 sm:grid-cols-2">
          <CheckboxField label="Mould on the feed" name="mould" />
          <CheckboxField label="Dead worms" name="wormDeaths" />
          <CheckboxField label="Worms leaving the bed (on walls or the surface)" name="exodus" />
        </div>
      </fieldset>

      <fieldset className="space-y-1" id={controlId('pests')} tabIndex={-1}>
        <legend className="font-semibold">Pests and other residents</legend>
        <div className="grid gap-x-4 sm:grid-cols-2">
          {(Object.keys(PEST_LABELS) as (keyof typeof PEST_LABELS)[]).map((p) => (
            <CheckboxField key={p} label={PEST_LABELS[p]} name="pests" value={p} hint={p === 'land-flatworms' ? 'They eat earthworms. Never cut one: every piece regrows. Kill it whole.' : undefined} />
          ))}
        </div>
      </fieldset>

      <TextareaField label="Notes" name="notes" rows={3} error={err('notes')} hint="Optional. Markdown works." />

      <PhotoInput key={fileInputKey} id="check-in-photos" name="photos" onFiles={setFiles} />
      {files.length ? <p className="text-sm">{files.length} photo{files.length === 1 ? '' : 's'} will be uploaded after the check-in is saved.</p> : null}
      <UploadList items={uploads.items} />

      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" size="lg" disabled={pending}>
          {pending ? 'Saving…' : 'Save check-in'}
        </Button>
        <p role="status" className="font-semibold">
          {saved}
        </p>
      </div>
    </form>
  );
}
