import type { ReactNode } from 'react';
import { Logo } from '../../../components/logo';

/** The calm frame of the signed-out pages. */
export function AuthFrame({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main className="flex min-h-dvh items-start justify-center bg-ink px-4 py-10 sm:items-center">
      <div className="w-full max-w-md">
        <div className="mb-6 flex items-center gap-3 text-white">
          <Logo size={44} />
          <div>
            <p className="text-2xl font-black tracking-tight">Sparkwright</p>
            <p className="text-white/75">Guided ignition diagnosis for the shop floor</p>
          </div>
        </div>
        <div className="rounded-[var(--radius-card)] bg-panel p-6 shadow-xl">
          <h1 className="mb-4 text-2xl">{title}</h1>
          {children}
        </div>
      </div>
    </main>
  );
}
