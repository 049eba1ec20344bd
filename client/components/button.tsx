import type { ButtonHTMLAttributes, Ref } from 'react';

export type ButtonTone = 'primary' | 'secondary' | 'danger' | 'quiet';

const TONES: Record<ButtonTone, string> = {
  primary: 'bg-lichen text-paper hover:bg-lichen-dark border border-lichen',
  secondary: 'bg-card text-ink border border-rule hover:border-lichen hover:text-lichen-dark',
  danger: 'bg-card text-alert border border-alert/40 hover:bg-alert/5',
  quiet: 'bg-transparent text-lichen-dark border border-transparent underline-offset-2 hover:underline',
};

/**
 * Class names of Lagbook's buttons, so a router link that acts like a button looks the same
 * as a real one. Below 640 px every button is at least 44 × 44 px, a touch target a finger
 * can hit (the size of WCAG 2.2 SC 2.5.5).
 */
export function buttonClasses(tone: ButtonTone = 'secondary', size: 'sm' | 'md' = 'md'): string {
  const pad = size === 'sm' ? 'px-2.5 py-1 text-sm' : 'px-4 py-2';
  return `inline-flex items-center justify-center gap-1.5 rounded-lg font-medium disabled:cursor-not-allowed disabled:opacity-60 max-sm:min-h-11 max-sm:min-w-11 ${pad} ${TONES[tone]}`;
}

/** A button in one of Lagbook's tones; `type="button"` unless told otherwise, so it never submits a form by surprise. */
export function Button({
  tone = 'secondary',
  size = 'md',
  className = '',
  type = 'button',
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: ButtonTone; size?: 'sm' | 'md'; ref?: Ref<HTMLButtonElement> }) {
  return <button type={type} className={`${buttonClasses(tone, size)} ${className}`} {...rest} />;
}
