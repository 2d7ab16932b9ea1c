// Where a chart would stand but there is nothing to draw (every group hidden or empty): the chart's title
// and one sentence saying why, instead of empty axes.
export function NothingToChart({ title, text }: { title: string; text: string }) {
  return (
    <section className="flex flex-col gap-1 rounded-card border border-line bg-surface p-4 shadow-card">
      <h3 className="text-lead font-semibold text-ink">{title}</h3>
      <p className="text-muted">{text}</p>
    </section>
  );
}
