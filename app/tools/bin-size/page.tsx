import type { Metadata } from 'next';
import Link from 'next/link';
import {
  DecimalField,
  FieldErrorsAlert,
  inputClass,
  MassUnitOptions,
  raw,
  ResultList,
  ToolField,
  ToolFieldset,
  ToolHeader,
  ToolMethod,
  ToolResult,
  ToolSubmit,
} from '@/components/tools/form-bits';
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
      <ToolHeader title="Bin size and worm comfort">
        From the food scraps you throw out in a week: the bin surface, a box size and how many worms eat that much. Then check whether a bed&rsquo;s
        temperature and moisture suit the worms. Also: <Link href="/tools/mix">C:N and moisture of a mix</Link>,{' '}
        <Link href="/guides/starting-a-worm-bin">starting a worm bin</Link>.
      </ToolHeader>

      <form method="get" action="/tools/bin-size" className="space-y-6" noValidate aria-label="Bin size and comfort">
        <ToolFieldset legend="Bin size">
          <div className="grid gap-3 sm:grid-cols-3">
            <DecimalField id="bin-scraps" label="Food scraps a week" name="scraps" value={raw(sp.scraps)} error={e1('scraps')} />
            <ToolField id="bin-unit" label="Unit">
              {(p) => (
                <select {...p} name="unit" defaultValue={unit} className={inputClass}>
                  <MassUnitOptions />
                </select>
              )}
            </ToolField>
            <DecimalField
              id="bin-rate"
              label="Feed rate (optional)"
              name="rate"
              value={raw(sp.rate)}
              error={e1('rate')}
              hint={`kg of food per kg of worms a day; default ${DEFAULT_FEED_RATE}`}
            />
          </div>
        </ToolFieldset>
        <ToolFieldset legend="Worm comfort (optional)">
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
            <DecimalField id="bin-temp" label="Bed temperature" name="temp" value={raw(sp.temp)} error={e1('temp')} hint="5–10 cm down" />
            <ToolField id="bin-temp-unit" label="Temperature unit">
              {(p) => (
                <select {...p} name="tempUnit" defaultValue={raw(sp.tempUnit) === 'F' ? 'F' : 'C'} className={inputClass}>
                  <option value="C">°C</option>
                  <option value="F">°F</option>
                </select>
              )}
            </ToolField>
            <DecimalField id="bin-moisture" label="Moisture (%)" name="moisture" value={raw(sp.moisture)} error={e1('moisture')} hint="water as % of bedding weight" />
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
        </ToolFieldset>
        <ToolSubmit />
      </form>

      <FieldErrorsAlert show={submitted && Object.keys(errors).length > 0} />

      {bin ? (
        <ToolResult id="bin-result" title="Your bin">
          <ResultList>
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
          </ResultList>
          <p className="max-w-prose text-sm text-ink-muted">
            Start with fewer worms and feed less for the first weeks: a new bin takes a while to reach that rate.
          </p>
        </ToolResult>
      ) : null}

      {comfort ? (
        <ToolResult id="comfort-result" title={<>Comfort: {STATUS_WORDS[comfort.status]}</>}>
          <ul className="list-disc pl-5">
            {comfort.temperature ? <li>Temperature: {comfort.temperature.status}, {comfort.temperature.reason}.</li> : null}
            {comfort.moisture ? <li>Moisture: {comfort.moisture.status}, {comfort.moisture.reason}.</li> : null}
          </ul>
        </ToolResult>
      ) : null}

      <ToolMethod id="bin-how">
        One square foot of bin surface per pound of food scraps a week, about 8 inches deep (NC State Extension, AG-473-18). Worms eat about half
        their weight a day in good conditions (a rule of thumb from the OACC on-farm vermiculture manual, from memory). Comfort limits for{' '}
        <i>Eisenia fetida</i>: 4–30 °C and 60–90% moisture for breeding (Edwards (ed.), <i>Earthworm Ecology</i>, ch. 18, Table 18.3); worms die
        at 35 °C (Loehr, Neuhauser &amp; Malecki 1985). The two tropical species are cold-limited, dying below about 9 °C and above about 30 °C
        (from memory).
      </ToolMethod>
    </div>
  );
}
