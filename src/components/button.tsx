import type { ComponentPropsWithRef } from 'react';
import { Link, type LinkProps } from 'react-router-dom';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';

const BASE =
  'inline-flex items-center justify-center gap-1.5 rounded-md px-3 py-1.5 text-sm font-medium transition-colors ' +
  'disabled:opacity-60 disabled:cursor-not-allowed';
const VARIANTS: Record<Variant, string> = {
  primary: 'bg-accent text-accent-ink hover:opacity-90',
  secondary: 'border border-line-strong bg-surface text-ink hover:bg-sunken',
  danger: 'border border-danger/50 bg-surface text-danger hover:bg-danger-soft',
  quiet: 'text-ink hover:bg-sunken',
};

export function buttonClass(variant: Variant = 'secondary', extra = ''): string {
  return `${BASE} ${VARIANTS[variant]} ${extra}`;
}

export function Button({ variant = 'secondary', className = '', type = 'button', ...props }: ComponentPropsWithRef<'button'> & { variant?: Variant }) {
  return <button type={type} className={buttonClass(variant, className)} {...props} />;
}

export function ButtonLink({ variant = 'secondary', className = '', ...props }: LinkProps & { variant?: Variant }) {
  return <Link className={buttonClass(variant, className)} {...props} />;
}
