/** Honest stand-in for a screen another piece of work builds. */
export function Placeholder({ title, what }: { title: string; what: string }) {
  return (
    <section className="card max-w-2xl space-y-2 p-6">
      <h1 className="text-3xl font-bold">{title}</h1>
      <p className="text-lg">Not built yet. {what}</p>
    </section>
  );
}
