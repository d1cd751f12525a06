import type { ReactNode } from "react";

/** One part of the planning page: a landmark-free section with its h2 and a short introduction. */
export function PlanSection({
  id,
  title,
  intro,
  children,
}: {
  id: string;
  title: string;
  intro: ReactNode;
  children: ReactNode;
}) {
  return (
    <section id={id} aria-labelledby={`${id}-heading`} className="scroll-mt-4 border-t-2 border-border pt-6">
      <h2 id={`${id}-heading`} className="mb-2 text-2xl font-bold">
        {title}
      </h2>
      <div className="mb-4 max-w-3xl">{intro}</div>
      {children}
    </section>
  );
}
