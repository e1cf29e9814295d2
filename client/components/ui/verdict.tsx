import type { ReactNode } from 'react';
import { verdictLook, type Verdict as VerdictWord } from '../../../shared/plans/verdicts.ts';
import { cn } from '../../lib/cn.ts';

type VerdictProps = {
  verdict: VerdictWord;
  /** Words to show instead of the verdict's own (e.g. the session sentence); the glyph stays. */
  children?: ReactNode;
  className?: string;
};

/**
 * A part or session verdict as glyph and word in its colour (product.md): "● on pace", "▲ quick",
 * "◐ partly", "– unplanned". The glyph is decoration; the word is what is read out.
 */
export function Verdict({ verdict, children, className }: VerdictProps) {
  const look = verdictLook(verdict);
  return (
    <span className={cn('inline-flex items-baseline gap-1.5 font-semibold', className)} style={{ color: look.colour }}>
      <span aria-hidden="true" className="w-[1em] shrink-0 text-center">
        {look.glyph}
      </span>
      <span>{children ?? look.word}</span>
    </span>
  );
}
