import { cva, type VariantProps } from 'class-variance-authority';
import type { ButtonHTMLAttributes } from 'react';
import { cn } from '@/lib/cn';

export const buttonStyles = cva(
  'inline-flex items-center justify-center gap-2 rounded-lg font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-50 select-none',
  {
    variants: {
      tone: {
        primary: 'bg-copper-700 text-steam-50 hover:bg-copper-500 hover:text-ink-900',
        quiet: 'bg-steam-100 text-ink-900 hover:bg-steam-200 border border-steam-200',
        dark: 'bg-roast-600 text-crema-100 hover:bg-roast-750 border border-crema-300/40',
        bump: 'bg-crema-100 text-roast-950 hover:bg-crema-300',
      },
      size: {
        md: 'min-h-11 px-4 text-base',
        lg: 'min-h-16 px-6 text-xl',
        xl: 'min-h-20 px-8 text-2xl',
      },
    },
    defaultVariants: { tone: 'primary', size: 'md' },
  },
);

type Props = ButtonHTMLAttributes<HTMLButtonElement> & VariantProps<typeof buttonStyles>;

export function Button({ className, tone, size, type = 'button', ...rest }: Props) {
  return <button type={type} className={cn(buttonStyles({ tone, size }), className)} {...rest} />;
}
