import { cn } from '@/lib/cn';

/**
 * Rowpath's mark: four planted rows (dashed, like emerging seedlings) crossed by a curving path
 * — the specialist's route through the season. Decorative next to the "Rowpath" word.
 */
export function LogoMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={cn('shrink-0', className ?? 'size-9')} aria-hidden="true">
      <rect width="32" height="32" rx="7" fill="#283052" />
      <g stroke="#6fcbbd" strokeWidth="2.4" strokeLinecap="round" strokeDasharray="2.6 2.4">
        <path d="M7.5 6.5v19" />
        <path d="M12.5 6.5v19" />
        <path d="M17.5 6.5v19" />
        <path d="M22.5 6.5v19" />
      </g>
      <path d="M4.5 26.5C11 22 12 14 18.5 12.5S26 8 27.5 5" fill="none" stroke="#283052" strokeWidth="6" strokeLinecap="round" />
      <path d="M4.5 26.5C11 22 12 14 18.5 12.5S26 8 27.5 5" fill="none" stroke="#e1dacf" strokeWidth="2.6" strokeLinecap="round" />
    </svg>
  );
}

export function Logo({ className, tone = 'dark' }: { className?: string; tone?: 'dark' | 'light' }) {
  return (
    <span className={cn('inline-flex items-center gap-2.5', className)}>
      <LogoMark />
      <span className={cn('text-xl font-bold tracking-tight', tone === 'dark' ? 'text-white' : 'text-ink-900')}>Rowpath</span>
    </span>
  );
}
