import { Link, type LinkProps } from 'react-router-dom';
import { cn } from '../../lib/cn.ts';

/** A link that looks like a secondary button, for next steps in empty states and error pages. */
export function LinkButton({ className, ...props }: LinkProps) {
  return (
    <Link
      className={cn(
        'inline-flex min-h-11 items-center rounded-md border border-line bg-card px-3.5 py-1.5 text-sm font-semibold text-teal hover:border-teal sm:min-h-9',
        className,
      )}
      {...props}
    />
  );
}
