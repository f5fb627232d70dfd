import type { ReactNode } from 'react';

/** The narrow sheet that the signed-out screens sit on. */
export function AuthFrame({ title, lead, children, aside }: { title: string; lead?: ReactNode; children: ReactNode; aside?: ReactNode }) {
  return (
    <div className="mx-auto grid max-w-4xl gap-10 py-4 md:grid-cols-[minmax(0,1fr)_minmax(0,22rem)] md:py-10">
      <div className="rounded-lg border border-rule bg-paper-raised p-6 shadow-[0_1px_0_rgb(31_42_51/0.06)] sm:p-8">
        <h1 className="mb-2 text-2xl font-semibold">{title}</h1>
        {lead ? <div className="mb-6 text-ink-soft">{lead}</div> : <div className="mb-6" />}
        {children}
      </div>
      {aside ? <aside className="space-y-3 text-sm text-ink-soft md:pt-8">{aside}</aside> : null}
    </div>
  );
}

export function ProductNote() {
  return (
    <>
      <p className="font-mono text-xs uppercase tracking-[0.14em] text-ink-soft">Planewright</p>
      <p className="text-base text-ink">
        Briefs, revisions, audits and cut packs for symmetric pieces built from flat sheet parts that meet square.
      </p>
      <p>
        Each part is cut flat, so every joint is between two parts whose planes meet at 90°. Planewright checks that
        before the sheets go on the laser.
      </p>
    </>
  );
}
