import { Link, type LinkProps } from 'react-router-dom';
import { cn } from '../../lib/cn.ts';

/** The secondary-button look of a link (outlined, teal words), shared by in-app links and download links. */
export const SECONDARY_LINK =
  'inline-flex min-h-11 items-center rounded-md border border-line bg-card px-3.5 py-1.5 text-sm font-semibold text-teal hover:border-teal sm:min-h-9';

/** A link that looks like a secondary button, for next steps in empty states and error pages. */
export function LinkButton({ className, ...props }: LinkProps) {
  return <Link className={cn(SECONDARY_LINK, className)} {...props} />;
}
