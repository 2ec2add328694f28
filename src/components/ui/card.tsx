import type { ReactNode, Ref } from 'react';

export function Card({
  title,
  children,
  className = '',
  ref,
}: {
  title?: ReactNode;
  children: ReactNode;
  className?: string;
  ref?: Ref<HTMLElement>;
}) {
  return (
    <section
      ref={ref}
      className={`rounded-card border border-line bg-paper-raised p-5 shadow-card ${className}`}
    >
      {title ? <h2 className="mb-3 text-lg font-semibold text-ink">{title}</h2> : null}
      {children}
    </section>
  );
}
