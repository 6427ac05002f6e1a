import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-accent text-accent-ink hover:opacity-90 border border-accent',
  secondary: 'bg-panel text-ink border border-rule hover:bg-sunken',
  quiet: 'text-ink-soft hover:bg-sunken hover:text-ink border border-transparent',
  danger: 'bg-panel text-fail border border-fail/50 hover:bg-fail-soft',
};

/** Classes of a button, for links that look like one. */
export function buttonClass(variant: Variant = 'secondary', size: 'sm' | 'md' = 'md'): string {
  const sizing = size === 'sm' ? 'px-2 py-1 text-xs' : 'px-3 py-1.5 text-sm';
  return `inline-flex items-center justify-center gap-1.5 rounded-md font-medium transition-colors disabled:cursor-not-allowed disabled:opacity-50 ${sizing} ${VARIANTS[variant]}`;
}

/** A button in one of our four looks. */
export function Button({
  variant = 'secondary',
  size = 'md',
  className = '',
  type = 'button',
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; size?: 'sm' | 'md' }) {
  return <button type={type} className={`${buttonClass(variant, size)} ${className}`} {...props} />;
}
