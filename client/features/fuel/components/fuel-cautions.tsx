import type { Caution } from '../../../../shared/fuel/cautions.ts';
import { LAST_WORD } from '../../../../shared/fuel/cautions.ts';

type FuelCautionsProps = { cautions: readonly Caution[]; title?: string; headingLevel?: 'h2' | 'h3' };

/** The cautions with their sources, and who has the last word (product.md, Safety). Always open: never folded away. */
export function FuelCautions({ cautions, title = 'Cautions', headingLevel = 'h2' }: FuelCautionsProps) {
  const Heading = headingLevel;
  const lastWords = [...new Set([LAST_WORD, ...cautions.map((c) => c.last_word)])];
  return (
    <section
      aria-label={title}
      className="rounded-md border-l-4 border-tartan bg-tartan-wash/60 px-3 py-2 text-sm print:border-black print:bg-white"
    >
      <Heading className="font-semibold text-tartan-deep print:text-black">
        <span aria-hidden="true">⚠ </span>
        {title}
      </Heading>
      <ul className="mt-1 flex flex-col gap-2">
        {cautions.map((c) => (
          <li key={c.topic}>
            <p>
              <strong>{c.title}.</strong> {c.text}
            </p>
            <p className="text-xs text-ink-muted print:text-black">Source: {c.source}</p>
          </li>
        ))}
      </ul>
      {lastWords.map((w) => (
        <p key={w} className="mt-2 font-semibold">
          {w}
        </p>
      ))}
    </section>
  );
}
