'use client';

import { startTransition, useActionState, useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { SETTINGS, SETTING_DESCRIPTIONS, SETTING_LABELS } from '@/components/layout/vocabulary';
import { zodFieldErrors, type ActionState, type FieldErrors } from '@/lib/errors';
import { TrialCreateSchema, TrialUpdateSchema, trialInputFromForm } from '@/lib/validation/trials';
import { FeedstockCombobox, type FeedstockOption } from './feedstock-combobox';
import { CheckboxField, controlId, ErrorSummary, optionsFromLabels, QuantityField, SelectField, TextareaField } from './form-controls';
import {
  AREA_UNIT_LABELS,
  LENGTH_UNIT_LABELS,
  MASS_UNIT_LABELS,
  PREPARATION_LABELS,
  PROVENANCE_LABELS,
  SPECIES_LABELS,
  VOLUME_UNIT_LABELS,
} from './vocabulary';

type State = ActionState & { values?: Record<string, string | string[]>; id?: number };

export type PairableOption = { id: number; feedstockId: number; label: string };

export type TrialFormProps = {
  mode: 'create' | 'edit';
  action: (prev: State, formData: FormData) => Promise<State>;
  feedstocks: readonly FeedstockOption[];
  pairable: readonly PairableOption[];
  /** Starting values by field name (edit: the trial; create: defaults). */
  initial: Record<string, string>;
  /** Edit: the trial's version, sent back for the conflict check. */
  version?: number;
  /** Edit: the trial's id, sent in the `trialId` field. */
  trialId?: number;
  /** Edit: the trial's feedstock (it cannot change). */
  fixedFeedstock?: FeedstockOption;
};

const massUnits = optionsFromLabels(MASS_UNIT_LABELS);
const lengthUnits = optionsFromLabels(LENGTH_UNIT_LABELS);
const doseUnits = [
  { group: 'Mass', options: massUnits },
  { group: 'Volume', options: optionsFromLabels(VOLUME_UNIT_LABELS) },
];

/** Names shown in the error summary. */
const LABELS: Record<string, string> = {
  feedstockId: 'Feedstock',
  setting: 'Setting',
  preparation: 'Preparation',
  provenance: 'Where it came from',
  'surfaceArea.amount': 'Surface area',
  'surfaceArea.unit': 'Surface area unit',
  'bedDepth.amount': 'Bed depth',
  species: 'Worm species',
  'wormMass.amount': 'Worm mass',
  'dose.amount': 'Dose',
  'dose.unit': 'Dose unit',
  'layerDepth.amount': 'Layer depth',
  pairedTrialId: 'Paired trial',
  region: 'Region',
  startDate: 'Start date',
  checkInEveryDays: 'Check-in schedule',
  notes: 'Notes',
  version: 'Version',
};

/**
 * The new-trial (and edit-trial) form. It checks the input with the same zod
 * schema as the server before sending, shows each message next to its field
 * and in a summary, and never clears what was typed: the server action is
 * dispatched by hand (no automatic form reset), and its state echoes the
 * submitted values for the no-JavaScript path.
 */
export function TrialForm({ mode, action, feedstocks, pairable, initial, version, trialId, fixedFeedstock }: TrialFormProps) {
  const [state, dispatch, pending] = useActionState(action, { ok: false });
  const [clientErrors, setClientErrors] = useState<FieldErrors | null>(null);
  const [feedstock, setFeedstock] = useState<FeedstockOption | null>(
    fixedFeedstock ?? feedstocks.find((f) => String(f.id) === initial.feedstockId) ?? null,
  );
  const formRef = useRef<HTMLFormElement>(null);
  const values = { ...initial, ...(state.values as Record<string, string> | undefined) };
  const errors: FieldErrors = clientErrors ?? state.fieldErrors ?? {};
  const err = (name: string) => errors[name]?.[0];
  const pairOptions = pairable.filter((p) => feedstock && p.feedstockId === feedstock.id);

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formData = new FormData(e.currentTarget);
    const input = trialInputFromForm(formData);
    const parsed = mode === 'create' ? TrialCreateSchema.safeParse(input) : TrialUpdateSchema.safeParse(input);
    if (!parsed.success) {
      const found = zodFieldErrors(parsed.error);
      setClientErrors(found);
      const first = Object.keys(found)[0];
      requestAnimationFrame(() => document.getElementById(controlId(first))?.focus() ?? document.getElementById('form-errors')?.focus());
      return;
    }
    setClientErrors(null);
    startTransition(() => dispatch(formData));
  }

  return (
    <form ref={formRef} action={dispatch} onSubmit={onSubmit} noValidate className="space-y-8">
      {trialId ? <input type="hidden" name="trialId" value={trialId} /> : null}
      <ErrorSummary errors={errors} labels={LABELS} message={!state.ok && !clientErrors ? state.message : undefined} />
      {version !== undefined ? <input type="hidden" name="version" value={version} /> : null}

      <fieldset className="space-y-4">
        <legend className="font-display text-2xl">What went in</legend>
        {fixedFeedstock ? (
          <p>
            Feedstock: <strong>{fixedFeedstock.name}</strong> <span className="text-ink-muted">(a trial’s feedstock cannot change)</span>
          </p>
        ) : (
          <FeedstockCombobox feedstocks={feedstocks} defaultId={values.feedstockId ? Number(values.feedstockId) : null} error={err('feedstockId')} onChange={setFeedstock} />
        )}
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField label="Preparation" name="preparation" options={optionsFromLabels(PREPARATION_LABELS)} defaultValue={values.preparation} placeholder="Choose…" required error={err('preparation')} />
          <SelectField label="Where it came from" name="provenance" options={optionsFromLabels(PROVENANCE_LABELS)} defaultValue={values.provenance} placeholder="Choose…" required error={err('provenance')} hint="Store-bought fruit can carry a wax coating." />
        </div>
        <div className="grid gap-4 sm:grid-cols-2">
          <QuantityField
            label="Dose"
            name="dose"
            units={doseUnits}
            defaultAmount={values['dose.amount']}
            defaultUnit={values['dose.unit'] || 'kg'}
            errors={errors}
            required
            hint={feedstock && !feedstock.acceptsVolume ? 'Give a mass: this feedstock has no bulk density yet.' : 'By weight or by volume, in the units you used.'}
          />
          <QuantityField label="Layer depth" name="layerDepth" units={lengthUnits} defaultAmount={values['layerDepth.amount']} defaultUnit={values['layerDepth.unit'] || 'cm'} errors={errors} hint="How thick the feedstock lay. Optional." />
        </div>
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="font-display text-2xl">Where</legend>
        <fieldset className="space-y-2">
          <legend className="font-semibold">
            Setting <span className="font-normal text-ink-muted">(required)</span>
          </legend>
          <div className="grid gap-2 md:grid-cols-3" id={controlId('setting')} tabIndex={-1}>
            {SETTINGS.map((s) => (
              <label key={s} className="flex min-h-touch cursor-pointer gap-3 rounded-lg border border-line-strong bg-surface-raised p-3 has-[:checked]:border-2 has-[:checked]:border-accent has-[:checked]:bg-accent-soft">
                <input type="radio" name="setting" value={s} defaultChecked={values.setting === s} className="mt-1 size-5 shrink-0 accent-accent" aria-describedby={`setting-${s}-desc`} />
                <span>
                  <span className="block font-semibold">{SETTING_LABELS[s]}</span>
                  <span id={`setting-${s}-desc`} className="block text-sm text-ink-muted">
                    {SETTING_DESCRIPTIONS[s]}
                  </span>
                </span>
              </label>
            ))}
          </div>
          {err('setting') ? <p className="text-sm font-semibold text-danger">{err('setting')}</p> : null}
        </fieldset>
        <div className="grid gap-4 sm:grid-cols-2">
          <QuantityField label="Surface area of the bed or bin" name="surfaceArea" units={optionsFromLabels(AREA_UNIT_LABELS)} defaultAmount={values['surfaceArea.amount']} defaultUnit={values['surfaceArea.unit'] || 'm2'} errors={errors} required hint="The area the dose was spread over." />
          <QuantityField label="Bed or bin depth" name="bedDepth" units={lengthUnits} defaultAmount={values['bedDepth.amount']} defaultUnit={values['bedDepth.unit'] || 'cm'} errors={errors} hint="Optional." />
        </div>
        <Field
          label="Region"
          name="region"
          id={controlId('region')}
          required
          autoComplete="address-level2"
          defaultValue={values.region}
          error={err('region')}
          hint="A town, district or county — never an address. Trialbed stores the region only, so no one can place your garden."
        />
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="font-display text-2xl">Worms</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField label="Worm species" name="species" options={optionsFromLabels(SPECIES_LABELS)} defaultValue={values.species || 'eisenia-fetida'} required error={err('species')} />
          <QuantityField label="Worm mass (estimate)" name="wormMass" units={massUnits} defaultAmount={values['wormMass.amount']} defaultUnit={values['wormMass.unit'] || 'kg'} errors={errors} hint="Optional; gives the feed ratio." />
        </div>
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="font-display text-2xl">Plan</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Start date" name="startDate" id={controlId('startDate')} type="date" required defaultValue={values.startDate} error={err('startDate')} />
          <Field
            label="Check in every … days"
            name="checkInEveryDays"
            id={controlId('checkInEveryDays')}
            type="number"
            inputMode="numeric"
            min={1}
            max={60}
            required
            defaultValue={values.checkInEveryDays || '7'}
            error={err('checkInEveryDays')}
            hint="We remind you when a check-in is due. Weekly suits most trials."
          />
        </div>
        <SelectField
          label="Paired trial (comparison or control plot)"
          name="pairedTrialId"
          options={pairOptions.map((p) => ({ value: String(p.id), label: p.label }))}
          defaultValue={values.pairedTrialId}
          placeholder={pairOptions.length ? 'None' : 'None (your other trials of this feedstock appear here)'}
          error={err('pairedTrialId')}
          hint="Optional. Log the other plot as its own trial first, then pair them."
        />
        <CheckboxField label="This plot is the control (reference feed)" name="isControl" defaultChecked={values.isControl === 'on'} />
        <TextareaField label="Notes" name="notes" defaultValue={values.notes} error={err('notes')} hint="Optional. Markdown works: *emphasis*, lists, links." rows={4} />
      </fieldset>

      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" size="lg" disabled={pending}>
          {pending ? 'Saving…' : mode === 'create' ? 'Log this trial' : 'Save changes'}
        </Button>
        {pending ? <span role="status">Saving the trial…</span> : null}
      </div>
    </form>
  );
}
