import type { Metadata } from 'next';
import Link from 'next/link';
import { inputClass, raw, ToolField } from '@/components/tools/form-bits';
import { buttonClasses } from '@/components/ui/button';
import { checkComfort, DEFAULT_FEED_RATE, suggestBin, toCelsius, type ComfortResult, type WormSpecies } from '@/lib/evidence';
import { formatNumber } from '@/lib/format';
import { BinSizeParamsSchema, parseForm } from '@/lib/validation/tools';

export const metadata: Metadata = {
  title: 'Bin size and worm comfort',
  description: 'How big a worm bin your weekly food scraps need, how many worms to start with, and whether a bed is too hot, cold, wet or dry.',
  alternates: { canonical: '/tools/bin-size' },
};

const SPECIES_LABELS: Record<WormSpecies, string> = {
  'eisenia-fetida': 'Eisenia fetida (red worm, tiger worm)',
  'eisenia-andrei': 'Eisenia andrei',
  'perionyx-excavatus': 'Perionyx excavatus (blue worm)',
  'eudrilus-eugeniae': 'Eudrilus eugeniae (African nightcrawler)',
};

const STATUS_WORDS: Record<ComfortResult['status'], string> = {
  'within limits': 'Comfortable: within limits',
  stressful: 'Stressful',
  lethal: 'Dangerous: worms die here',
};

type SP = Record<string, string | string[] | undefined>;

export default async function BinSizePage({ searchParams }: { searchParams: Promise<SP> }) {
  const sp = await searchParams;
  const submitted = Object.keys(sp).length > 0;
  const { data, errors } = parseForm(BinSizeParamsSchema, sp);
  const e1 = (k: string) => errors[k]?.[0];
  const unit = raw(sp.unit) === 'lb' ? 'lb' : 'kg';
  const bin = data?.scraps !== undefined ? suggestBin({ amount: data.scraps, unit: data.unit }, data.rate ?? DEFAULT_FEED_RATE) : null;
  const comfort =
    data && (data.temp !== undefined || data.moisture !== undefined)
      ? checkComfort({ species: data.species, bedTempC: data.temp !== undefined ? toCelsius(data.temp, data.tempUnit) : null, moisture: data.moisture ?? null })
      : null;

  return (
    <div className="space-y-8">
      <header className="space-y-2">
        <h1 className="text-3xl">Bin size and worm comfort</h1>
        <p className="max-w-prose">
          From the food scraps you throw out in a week: the bin surface, a box size and how many worms eat that much. Then check whether a bed&rsquo;s
          temperature and moisture suit the worms. Also: <Link href="/tools/mix">C:N and moisture of a mix</Link>,{' '}
          <Link href="/guides/starting-a-worm-bin">starting a worm bin</Link>.
        </p>
      </header>

      <form method="get" action="/tools/bin-size" className="space-y-6" noValidate aria-label="Bin size and comfort">
        <fieldset className="space-y-3 rounded-lg border border-line bg-surface-raised p-4">
          <legend className="px-1 font-display text-xl">Bin size</legend>
          <div className="grid gap-3 sm:grid-cols-3">
            <ToolField id="bin-scraps" label="Food scraps a week" error={e1('scraps')}>
              {(p) => <input {...p} name="scraps" inputMode="decimal" defaultValue={raw(sp.scraps)} className={inputClass} />}
            </ToolField>
            <ToolField id="bin-unit" label="Unit">
              {(p) => (
                <select {...p} name="unit" defaultValue={unit} className={inputClass}>
                  <option value="kg">kilograms</option>
                  <option value="lb">pounds</option>
                </select>
              )}
            </ToolField>
            <ToolField
              id="bin-rate"
              label="Feed rate (optional)"
              error={e1('rate')}
              hint={`kg of food per kg of worms a day; default ${DEFAULT_FEED_RATE}`}
            >
              {(p) => <input {...p} name="rate" inputMode="decimal" defaultValue={raw(sp.rate)} className={inputClass} />}
            </ToolField>
          </div>
        </fieldset>
        <fieldset className="space-y-3 rounded-lg border border-line bg-surface-raised p-4">
          <legend className="px-1 font-display text-xl">Worm comfort (optional)</legend>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
            <ToolField id="bin-temp" label="Bed temperature" error={e1('temp')} hint="5–10 cm down">
              {(p) => <input {...p} name="temp" inputMode="decimal" defaultValue={raw(sp.temp)} className={inputClass} />}
            </ToolField>
            <ToolField id="bin-temp-unit" label="Temperature unit">
              {(p) => (
                <select {...p} name="tempUnit" defaultValue={raw(sp.tempUnit) === 'F' ? 'F' : 'C'} className={inputClass}>
                  <option value="C">°C</option>
                  <option value="F">°F</option>
                </select>
              )}
            </ToolField>
            <ToolField id="bin-moisture" label="Moisture (%)" error={e1('moisture')} hint="water as % of bedding weight">
              {(p) => <input {...p} name="moisture" inputMode="decimal" defaultValue={raw(sp.moisture)} className={inputClass} />}
            </ToolField>
            <ToolField id="bin-species" label="Worms" error={e1('species')}>
              {(p) => (
                <select {...p} name="species" defaultValue={raw(sp.species) || 'eisenia-fetida'} className={inputClass}>
                  {(Object.keys(SPECIES_LABELS) as WormSpecies[]).map((s) => (
                    <option key={s} value={s}>
                      {SPECIES_LABELS[s]}
                    </option>
                  ))}
                </select>
              )}
            </ToolField>
          </div>
        </fieldset>
        <button type="submit" className={buttonClasses('primary', 'lg')}>
          Work it out
        </button>
      </form>

      {submitted && Object.keys(errors).length ? (
        <p role="alert" className="rounded-md border-2 border-danger bg-verdict-avoid-soft p-3">
          Some fields need attention: see the messages next to them.
        </p>
      ) : null}

      {bin ? (
        <section aria-labelledby="bin-result" className="space-y-3" role="status">
          <h2 id="bin-result" className="text-2xl">
            Your bin
          </h2>
          <dl className="grid max-w-xl grid-cols-[auto_1fr] gap-x-6 gap-y-1 text-lg">
            <dt className="font-semibold">Surface</dt>
            <dd>
              {formatNumber(bin.areaM2, 2)} m² ({formatNumber(bin.areaFt2, 2)} ft²)
            </dd>
            <dt className="font-semibold">A box that fits</dt>
            <dd>
              {bin.box.widthFt} × {bin.box.lengthFt} ft ({formatNumber(bin.box.widthFt * 0.3048, 2)} × {formatNumber(bin.box.lengthFt * 0.3048, 2)} m)
            </dd>
            <dt className="font-semibold">Depth</dt>
            <dd>
              {bin.depthIn} in ({formatNumber(bin.depthCm, 2)} cm)
            </dd>
            <dt className="font-semibold">Worms</dt>
            <dd>
              {formatNumber(bin.wormMassKg, 2)} kg ({formatNumber(bin.wormMassLb, 2)} lb) at {formatNumber(bin.feedRate, 2)} kg of food per kg of
              worms a day
            </dd>
          </dl>
          <p className="max-w-prose text-sm text-ink-muted">
            Start with fewer worms and feed less for the first weeks: a new bin takes a while to reach that rate.
          </p>
        </section>
      ) : null}

      {comfort ? (
        <section aria-labelledby="comfort-result" className="space-y-3" role="status">
          <h2 id="comfort-result" className="text-2xl">
            Comfort: {STATUS_WORDS[comfort.status]}
          </h2>
          <ul className="list-disc pl-5">
            {comfort.temperature ? <li>Temperature: {comfort.temperature.status}, {comfort.temperature.reason}.</li> : null}
            {comfort.moisture ? <li>Moisture: {comfort.moisture.status}, {comfort.moisture.reason}.</li> : null}
          </ul>
        </section>
      ) : null}

      <section aria-labelledby="bin-how" className="max-w-prose space-y-2 text-sm text-ink-muted">
        <h2 id="bin-how" className="text-lg text-ink">
          How it is worked out
        </h2>
        <p>
          One square foot of bin surface per pound of food scraps a week, about 8 inches deep (NC State Extension, AG-473-18). Worms eat about half
          their weight a day in good conditions (a rule of thumb from the OACC on-farm vermiculture manual, from memory). Comfort limits for{' '}
          <i>Eisenia fetida</i>: 4–30 °C and 60–90% moisture for breeding (Edwards (ed.), <i>Earthworm Ecology</i>, ch. 18, Table 18.3); worms die
          at 35 °C (Loehr, Neuhauser &amp; Malecki 1985). The two tropical species are cold-limited, dying below about 9 °C and above about 30 °C
          (from memory).
        </p>
      </section>
    </div>
  );
}
