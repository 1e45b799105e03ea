import type { Metadata } from 'next';
import Link from 'next/link';
import {
  DecimalField,
  FieldErrorsAlert,
  inputClass,
  MassUnitOptions,
  raw,
  ResultList,
  ToolAlert,
  ToolField,
  ToolFieldset,
  ToolHeader,
  ToolMethod,
  ToolResult,
  ToolSubmit,
} from '@/components/tools/form-bits';
import { Table } from '@/components/ui/table';
import { amountForCN, amountForMoisture, mixProperties, REFERENCE_MATERIALS, type MixIngredient } from '@/lib/evidence';
import { formatNumber } from '@/lib/format';
import { listMixFeedstocks, type MixMaterialDTO } from '@/lib/queries/feedstocks';
import { MIX_ROWS, MixParamsSchema, parseForm } from '@/lib/validation/tools';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = {
  title: 'Mix calculator: C:N and moisture',
  description: 'Carbon-to-nitrogen ratio and moisture of a mix of feedstocks and bedding, and how much of a second material reaches a target.',
  alternates: { canonical: '/tools/mix' },
};

type SP = Record<string, string | string[] | undefined>;

/** The material selects' groups: published reference values, then this site's feedstocks. */
const MATERIAL_GROUPS = [
  { prefix: 'ref:', label: 'Reference table (published values)' },
  { prefix: 'feedstock:', label: 'Feedstocks on this site' },
] as const;

function materials(fromDb: MixMaterialDTO[]): MixMaterialDTO[] {
  const refs: MixMaterialDTO[] = REFERENCE_MATERIALS.map((m) => ({
    id: `ref:${m.id}`,
    name: `${m.name} (reference table)`,
    nitrogenPct: m.nitrogenPct.value,
    cnRatio: m.cnRatio.value,
    moisturePct: m.moisturePct.value,
    source: m.cnRatio.source,
  }));
  return [...refs, ...fromDb];
}

export default async function MixPage({ searchParams }: { searchParams: Promise<SP> }) {
  const sp = await searchParams;
  const all = materials(await listMixFeedstocks());
  const byId = new Map(all.map((m) => [m.id, m]));
  const submitted = Object.keys(sp).length > 0;
  const { data, errors } = parseForm(MixParamsSchema, sp);
  const err = { ...errors };
  for (let i = 1; i <= MIX_ROWS; i++) {
    const id = raw(sp[`m${i}`]);
    if (id && !byId.has(id)) err[`m${i}`] = ['Choose a material from the list.'];
  }
  const addId = raw(sp.add);
  if (addId && !byId.has(addId)) err.add = ['Choose a material from the list.'];
  const unit = raw(sp.unit) === 'lb' ? 'lb' : 'kg';

  let result: { props: ReturnType<typeof mixProperties>; rows: (MixIngredient & { name: string })[]; target?: { text: string } } | null = null;
  let formError: string | null = null;
  if (submitted && data && !Object.keys(err).length) {
    const d = data as Record<string, unknown>;
    const rows: (MixIngredient & { name: string })[] = [];
    for (let i = 1; i <= MIX_ROWS; i++) {
      const m = d[`m${i}`] ? byId.get(d[`m${i}`] as string) : undefined;
      if (m) rows.push({ name: m.name, wetMass: d[`q${i}`] as number, moisturePct: m.moisturePct, nitrogenPct: m.nitrogenPct, cnRatio: m.cnRatio });
    }
    if (!rows.length) formError = 'Choose at least one material and its amount.';
    else {
      try {
        const props = mixProperties(rows);
        result = { props, rows };
        if (data.goal !== 'none' && data.add && data.target !== undefined) {
          const add = byId.get(data.add)!;
          const mixAsOne: MixIngredient = {
            wetMass: props.wetMass,
            moisturePct: props.moisturePct,
            nitrogenPct: (props.nitrogenMass / props.dryMass) * 100,
            carbonPct: (props.carbonMass / props.dryMass) * 100,
          };
          const second = { moisturePct: add.moisturePct, nitrogenPct: add.nitrogenPct, cnRatio: add.cnRatio };
          const t =
            data.goal === 'cn'
              ? amountForCN(mixAsOne, second, data.target)
              : amountForMoisture({ wetMass: props.wetMass, moisturePct: props.moisturePct }, second, data.target);
          const what = data.goal === 'cn' ? `a C:N of ${formatNumber(data.target, 3)}` : `${formatNumber(data.target, 3)}% moisture`;
          result.target = {
            text:
              t.amount === null
                ? `No amount of ${add.name.toLowerCase()} reaches ${what}: ${t.reason}.`
                : t.amount === 0
                  ? `The mix is already at ${what}.`
                  : `Add ${formatNumber(t.amount, 3)} ${unit} of ${add.name.toLowerCase()} to reach ${what}.`,
          };
        }
      } catch (e) {
        formError = e instanceof RangeError ? `These amounts cannot be mixed: ${e.message}.` : 'Something went wrong with that mix.';
      }
    }
  }

  const options = (
    <>
      <option value="">Choose a material</option>
      {MATERIAL_GROUPS.map((g) => (
        <optgroup key={g.prefix} label={g.label}>
          {all
            .filter((m) => m.id.startsWith(g.prefix))
            .map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
        </optgroup>
      ))}
    </>
  );
  const e1 = (k: string) => err[k]?.[0];

  return (
    <div className="space-y-8">
      <ToolHeader title="Mix calculator: C:N and moisture">
        The carbon-to-nitrogen ratio and moisture of a mix of feedstocks and bedding, weighted by each one&rsquo;s dry matter (not a plain average
        of the ratios), and how much of another material brings the mix to a target. Also: <Link href="/tools/bin-size">bin size and worm comfort</Link>.
      </ToolHeader>

      <form method="get" action="/tools/mix" className="space-y-6" noValidate aria-label="Mix">
        <ToolFieldset legend="What goes in">
          <ToolField id="mix-unit" label="Amounts in">
            {(p) => (
              <select {...p} name="unit" defaultValue={unit} className={`${inputClass} max-w-40`}>
                <MassUnitOptions />
              </select>
            )}
          </ToolField>
          {Array.from({ length: MIX_ROWS }, (_, k) => k + 1).map((i) => (
            <div key={i} className="grid gap-3 sm:grid-cols-[2fr_1fr]">
              <ToolField id={`mix-m${i}`} label={`Material ${i}`} error={e1(`m${i}`)}>
                {(p) => (
                  <select {...p} name={`m${i}`} defaultValue={raw(sp[`m${i}`])} className={inputClass}>
                    {options}
                  </select>
                )}
              </ToolField>
              <DecimalField id={`mix-q${i}`} label={`Amount ${i} (fresh, ${unit})`} name={`q${i}`} value={raw(sp[`q${i}`])} error={e1(`q${i}`)} />
            </div>
          ))}
        </ToolFieldset>
        <ToolFieldset legend="Reach a target (optional)">
          <div className="grid gap-3 sm:grid-cols-3">
            <ToolField id="mix-goal" label="Target" error={e1('goal')}>
              {(p) => (
                <select {...p} name="goal" defaultValue={raw(sp.goal) || 'none'} className={inputClass}>
                  <option value="none">No target</option>
                  <option value="cn">C:N ratio</option>
                  <option value="moisture">Moisture (%)</option>
                </select>
              )}
            </ToolField>
            <DecimalField id="mix-target" label="Value" name="target" value={raw(sp.target)} error={e1('target')} hint="e.g. 25 for C:N, 75 for moisture" />
            <ToolField id="mix-add" label="By adding" error={e1('add')}>
              {(p) => (
                <select {...p} name="add" defaultValue={addId} className={inputClass}>
                  {options}
                </select>
              )}
            </ToolField>
          </div>
        </ToolFieldset>
        <ToolSubmit />
      </form>

      {formError ? <ToolAlert>{formError}</ToolAlert> : null}
      <FieldErrorsAlert show={submitted && Object.keys(err).length > 0} />

      {result ? (
        <ToolResult id="mix-result" title="The mix" className="space-y-4">
          <ResultList>
            <dt className="font-semibold">C:N ratio</dt>
            <dd>{formatNumber(result.props.cnRatio, 3)}:1</dd>
            <dt className="font-semibold">Moisture</dt>
            <dd>{formatNumber(result.props.moisturePct, 3)}%</dd>
            <dt className="font-semibold">Fresh mass</dt>
            <dd>
              {formatNumber(result.props.wetMass, 3)} {unit} ({formatNumber(result.props.dryMass, 3)} {unit} dry matter)
            </dd>
          </ResultList>
          {result.target ? <p className="text-lg font-semibold">{result.target.text}</p> : null}
          <ul className="max-w-prose list-disc space-y-1 pl-5">
            <li>
              Worm beds are kept much wetter than a compost heap: worms grow and breed best at roughly 70–90% moisture (limits about 60–90%). The
              40–65% range quoted for hot composting does not apply to worm bedding.
            </li>
            <li>
              A hot compost heap starts best at a C:N of about 25–35:1. Worm bedding is kept high in carbon (paper, card, leaves); nitrogen-rich
              bedding gives off ammonia, which harms worms.
            </li>
          </ul>
          <Table caption="Ingredients and the values used">
            <thead>
              <tr>
                <th scope="col">Material</th>
                <th scope="col">Amount ({unit})</th>
                <th scope="col">Moisture</th>
                <th scope="col">N (% of dry)</th>
                <th scope="col">C:N</th>
              </tr>
            </thead>
            <tbody>
              {result.rows.map((r, i) => (
                <tr key={i}>
                  <th scope="row" className="border-t border-line font-normal">
                    {r.name}
                  </th>
                  <td>{formatNumber(r.wetMass, 3)}</td>
                  <td>{formatNumber(r.moisturePct, 3)}%</td>
                  <td>{formatNumber(r.nitrogenPct, 3)}</td>
                  <td>{formatNumber(r.cnRatio ?? 0, 3)}</td>
                </tr>
              ))}
            </tbody>
          </Table>
        </ToolResult>
      ) : null}

      <ToolMethod id="mix-how">
        Mix C:N = Σ mass × carbon × dry share ÷ Σ mass × nitrogen × dry share; mix moisture = Σ mass × moisture ÷ Σ mass (T. Richard and N.
        Trautmann, Cornell Waste Management Institute, &ldquo;Getting the right mix&rdquo;). Reference values: G. L. Bertrand&rsquo;s
        compost-calculator table (Missouri S&amp;T), drawing on the On-Farm Composting Handbook (NRAES-54); feedstock values name their own
        source on each page. Moisture ranges: Edwards (ed.), <i>Earthworm Ecology</i>, ch. 18; compost ranges: Cooperband (2002), <i>The Art and
        Science of Composting</i>.
      </ToolMethod>
    </div>
  );
}
