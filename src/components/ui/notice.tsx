import type { ReactNode } from 'react';

type Tone = 'info' | 'success' | 'caution' | 'danger';

const tones: Record<Tone, string> = {
  info: 'bg-spruce-50 border-spruce-200 text-spruce-800',
  success: 'bg-success-50 border-success-600 text-ink',
  caution: 'bg-caution-50 border-caution-600 text-ink',
  danger: 'bg-danger-50 border-danger-600 text-danger-700',
};

/** A message box; errors are announced to screen readers as alerts. */
export function Notice({ tone = 'info', children }: { tone?: Tone; children: ReactNode }) {
  return (
    <div
      role={tone === 'danger' ? 'alert' : 'status'}
      className={`rounded-control border-l-4 px-4 py-3 ${tones[tone]}`}
    >
      {children}
    </div>
  );
}
