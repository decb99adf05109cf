/** A titled block of the results panel. */
export function ResultsSection({
  title,
  children,
  id,
  aside,
}: {
  title: string;
  children: React.ReactNode;
  id?: string;
  aside?: React.ReactNode;
}) {
  return (
    <section aria-labelledby={id ? `${id}-title` : undefined} className="border-t border-rule pt-3" data-testid={id}>
      <div className="mb-2 flex items-baseline justify-between gap-2">
        <h3 id={id ? `${id}-title` : undefined} className="text-sm font-bold uppercase tracking-wide">
          {title}
        </h3>
        {aside}
      </div>
      {children}
    </section>
  );
}
