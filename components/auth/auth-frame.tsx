import type { ReactNode } from 'react';

/** The frame of the pages people see before signing in: Gatewell's panel beside one card. */
export function AuthFrame({
  title,
  intro,
  children,
}: {
  title: string;
  intro: ReactNode;
  children: ReactNode;
}) {
  return (
    <main className="grid min-h-screen lg:grid-cols-[1.1fr_1fr]">
      <section
        className="hidden flex-col justify-between bg-ink-950 p-12 text-ink-100 lg:flex"
        aria-hidden="true"
      >
        <p className="text-lg font-semibold tracking-wide text-white">Gatewell</p>
        <div className="max-w-md space-y-4">
          <p className="text-3xl font-semibold leading-tight text-white">
            From patch-clamp plate to signed-off potency, in one trail.
          </p>
          <p className="text-ink-300">
            Quality control per well, Hill fits with honest uncertainty, excitability forecasts and
            e-signatures for every plate.
          </p>
        </div>
        <p className="text-sm text-ink-300">
          Forecasts are research decision support, not a safety determination.
        </p>
      </section>
      <section className="flex items-center justify-center p-6">
        <div className="gw-card w-full max-w-sm p-8">
          <h1 className="text-2xl font-semibold">{title}</h1>
          <div className="mt-1 mb-6 text-sm text-ink-500">{intro}</div>
          {children}
        </div>
      </section>
    </main>
  );
}
