'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { VERDICT_LABELS, type Verdict } from '@/components/evidence/verdict-badge';
import { SETTING_LABELS, SETTINGS, type Setting } from '@/components/layout/vocabulary';
import { Button } from '@/components/ui';
import type { ProposeContext } from '@/lib/queries/proposals';
import { postJson } from './post-json';

type Row = { include: boolean; verdict: Verdict; ceiling: string; cautions: string };

/**
 * The verdict proposal form, prefilled from the current evidence verdict per
 * setting (falling back to the published one) and the trials that drove it.
 */
export function ProposalForm({ context }: { context: ProposeContext }) {
  const router = useRouter();
  const evidence = new Map(context.evidence.map((e) => [e.setting, e]));
  const published = new Map(context.published.map((p) => [p.setting, p]));
  const [rows, setRows] = useState<Record<Setting, Row>>(() => {
    const out = {} as Record<Setting, Row>;
    for (const s of SETTINGS) {
      const e = evidence.get(s);
      const p = published.get(s);
      const verdict = (e && e.verdict !== 'unsettled' ? e.verdict : p?.verdict ?? 'unsettled') as Verdict;
      const ceiling = e?.ceilingKgM2 ?? p?.ceilingKgM2 ?? null;
      out[s] = {
        include: !!e && e.verdict !== 'unsettled' && e.verdict !== p?.verdict,
        verdict,
        ceiling: ceiling === null ? '' : String(Math.round(ceiling * 100) / 100),
        cautions: (p?.cautions ?? []).join(', '),
      };
    }
    return out;
  });
  const driving = new Set(context.evidence.flatMap((e) => e.drivingTrialIds));
  const [cited, setCited] = useState<Set<number>>(() => new Set(context.trials.filter((t) => driving.has(t.id)).map((t) => t.id)));
  const [rationale, setRationale] = useState('');
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  const update = (s: Setting, patch: Partial<Row>) => setRows((r) => ({ ...r, [s]: { ...r[s], ...patch } }));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setPending(true);
    setErrors({});
    const settings = SETTINGS.filter((s) => rows[s].include).map((s) => ({
      setting: s,
      verdict: rows[s].verdict,
      ceilingKgM2: rows[s].ceiling.trim() === '' ? null : Number(rows[s].ceiling),
      cautions: rows[s].cautions.split(',').map((c) => c.trim()).filter(Boolean),
    }));
    const r = await postJson<{ id: number }>('/api/proposals', { feedstockId: context.feedstock.id, settings, rationale, trialIds: [...cited] });
    setPending(false);
    if (r.ok) {
      router.push(`/proposals/${r.data.id}`);
      return;
    }
    setErrors(r.fieldErrors);
    setMessage(r.message);
  }

  const err = (k: string) => errors[k]?.[0];
  return (
    <form onSubmit={submit} className="space-y-6" noValidate>
      <fieldset className="space-y-4">
        <legend className="text-xl font-semibold">Verdict per setting</legend>
        {err('settings') ? <p className="font-semibold text-danger">{err('settings')}</p> : null}
        {SETTINGS.map((s) => (
          <div key={s} className="space-y-2 rounded-md border border-line p-3">
            <label className="flex min-h-touch items-center gap-2 font-semibold">
              <input type="checkbox" className="size-5" checked={rows[s].include} onChange={(e) => update(s, { include: e.target.checked })} />
              Propose a verdict for {SETTING_LABELS[s].toLowerCase()}
            </label>
            {rows[s].include ? (
              <div className="grid gap-3 sm:grid-cols-3">
                <label className="block">
                  <span className="block text-sm font-semibold">Verdict</span>
                  <select value={rows[s].verdict} onChange={(e) => update(s, { verdict: e.target.value as Verdict })} className="min-h-touch w-full rounded-md border border-line-strong bg-surface-raised px-2">
                    {(Object.keys(VERDICT_LABELS) as Verdict[]).map((v) => (
                      <option key={v} value={v}>
                        {VERDICT_LABELS[v]}
                      </option>
                    ))}
                  </select>
                </label>
                <label className="block">
                  <span className="block text-sm font-semibold">Dose ceiling (kg/m², blank for none)</span>
                  <input inputMode="decimal" value={rows[s].ceiling} onChange={(e) => update(s, { ceiling: e.target.value })} aria-invalid={!!err(`settings.${SETTINGS.filter((x) => rows[x].include).indexOf(s)}.ceilingKgM2`)} className="min-h-touch w-full rounded-md border border-line-strong bg-surface-raised px-2" />
                </label>
                <label className="block">
                  <span className="block text-sm font-semibold">Cautions (comma-separated)</span>
                  <input value={rows[s].cautions} onChange={(e) => update(s, { cautions: e.target.value })} className="min-h-touch w-full rounded-md border border-line-strong bg-surface-raised px-2" />
                </label>
                {Object.entries(errors)
                  .filter(([k]) => k.startsWith(`settings.${SETTINGS.filter((x) => rows[x].include).indexOf(s)}.`))
                  .map(([k, v]) => (
                    <p key={k} className="text-sm font-semibold text-danger sm:col-span-3">
                      {v[0]}
                    </p>
                  ))}
              </div>
            ) : null}
          </div>
        ))}
      </fieldset>

      <div className="space-y-1">
        <label htmlFor="rationale" className="block text-xl font-semibold">
          Rationale
        </label>
        <p id="rationale-hint" className="text-sm text-ink-muted">
          What the trials show and why the published verdict should change.
        </p>
        <textarea id="rationale" value={rationale} onChange={(e) => setRationale(e.target.value)} rows={5} aria-describedby="rationale-hint rationale-error" aria-invalid={!!err('rationale')} className="w-full rounded-md border border-line-strong bg-surface-raised p-2" />
        {err('rationale') ? (
          <p id="rationale-error" className="text-sm font-semibold text-danger">
            {err('rationale')}
          </p>
        ) : null}
      </div>

      <fieldset className="space-y-2">
        <legend className="text-xl font-semibold">Trials it rests on</legend>
        {err('trialIds') ? <p className="font-semibold text-danger">{err('trialIds')}</p> : null}
        <ul className="grid gap-1 sm:grid-cols-2">
          {context.trials.map((t) => (
            <li key={t.id}>
              <label className="flex min-h-touch items-center gap-2">
                <input
                  type="checkbox"
                  className="size-5"
                  checked={cited.has(t.id)}
                  onChange={(e) =>
                    setCited((c) => {
                      const n = new Set(c);
                      if (e.target.checked) n.add(t.id);
                      else n.delete(t.id);
                      return n;
                    })
                  }
                />
                #{t.id} · {SETTING_LABELS[t.setting as Setting]} · {t.preparation} · {Math.round(t.surfaceLoadKgM2 * 100) / 100} kg/m² · {t.outcome ?? t.status}
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      {message ? (
        <p role="alert" className="font-semibold text-danger">
          {message}
        </p>
      ) : null}
      <Button type="submit" size="lg" disabled={pending}>
        {pending ? 'Sending…' : 'Open the proposal'}
      </Button>
    </form>
  );
}
