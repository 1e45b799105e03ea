import { cx } from '@/components/ui/class-names';

export const DEFER_TO_LOCAL_RULES =
  'Follow your local regulations and get licensed advice where it applies.';

export type SafetyNoteProps = {
  headingLevel?: 2 | 3;
  /** Heading id, for aria-labelledby on the enclosing section. */
  headingId?: string;
  className?: string;
};

/** Handling safety: gloves, dust, waste, shredders, and deference to local rules. */
export function SafetyNote({ headingLevel = 2, headingId, className }: SafetyNoteProps) {
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  return (
    <div className={cx('text-ink', className)}>
      <Heading id={headingId} className="text-lg">
        Handle with care
      </Heading>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        <li>
          Wear gloves when handling compost, potting mix, castings and manures, and wash your hands
          afterwards.
        </li>
        <li>
          Compost and potting-mix dust can carry <i>Legionella longbeachae</i> and mould spores.
          Dampen dry material and wear a dust mask when turning or screening it.
        </li>
        <li>Never put pet or human waste in a worm bin.</li>
        <li>
          Shredders and mulchers: wear eye and hearing protection, keep your hands out of the
          chute, and stop and disconnect the machine before clearing a jam.
        </li>
      </ul>
      <p className="mt-2 font-semibold">{DEFER_TO_LOCAL_RULES}</p>
    </div>
  );
}
