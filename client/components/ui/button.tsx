import type { ComponentProps } from 'react';
import { cn } from '../../lib/cn.ts';

const VARIANTS = {
  primary: 'bg-teal text-white hover:bg-teal-deep disabled:bg-teal/60',
  secondary: 'border border-line bg-card text-ink hover:border-teal hover:text-teal',
  quiet: 'text-teal underline-offset-2 hover:underline',
  danger: 'border border-tartan bg-card text-tartan hover:bg-tartan hover:text-white',
} as const;

export type ButtonProps = ComponentProps<'button'> & { variant?: keyof typeof VARIANTS };

export function Button({ variant = 'primary', className, type = 'button', ...props }: ButtonProps) {
  return (
    <button
      type={type}
      className={cn(
        'inline-flex min-h-11 items-center justify-center gap-2 rounded-md px-3.5 py-1.5 text-sm font-semibold transition-colors disabled:cursor-not-allowed sm:min-h-9',
        VARIANTS[variant],
        className,
      )}
      {...props}
    />
  );
}
