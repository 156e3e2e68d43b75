import { cva, type VariantProps } from 'class-variance-authority'
import type { ButtonHTMLAttributes } from 'react'
import { cn } from '../../lib/cn'

const buttonVariants = cva(
  'inline-flex items-center justify-center gap-2 rounded-md font-bold transition-colors focus-visible:outline-3 focus-visible:outline-offset-2 focus-visible:outline-brand-600 disabled:opacity-50 ' +
    'disabled:cursor-not-allowed',
  {
    variants: {
      variant: {
        primary: 'bg-brand-700 text-white hover:bg-brand-900',
        secondary: 'bg-white text-stone-900 border border-stone-300 hover:bg-stone-50',
        danger: 'bg-red-700 text-white hover:bg-red-800',
        ghost: 'text-stone-700 hover:bg-stone-200',
      },
      size: { sm: 'h-9 px-3 text-sm', md: 'h-11 px-4', bench: 'h-14 min-w-14 px-6 text-lg' },
    },
    defaultVariants: { variant: 'primary', size: 'md' },
  },
)

export type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & VariantProps<typeof buttonVariants>

export function Button({ className, variant, size, type = 'button', ...props }: ButtonProps) {
  return <button type={type} className={cn(buttonVariants({ variant, size }), className)} {...props} />
}
