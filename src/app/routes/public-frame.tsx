import type { ReactNode } from 'react';
import { Logo } from '../../components/ui/logo';

/** The frame of pages seen before signing in: a narrow column that suits a phone. */
export function PublicFrame({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main className="mx-auto flex min-h-dvh w-full max-w-md flex-col gap-6 px-5 py-10">
      <Logo />
      <h1 className="text-2xl font-semibold">{title}</h1>
      {children}
    </main>
  );
}
