/** Recovery codes, shown once: each signs in once in place of an app code. */
export function RecoveryCodes({ codes }: { codes: string[] }) {
  return (
    <section aria-labelledby="recovery-title" className="rounded border border-paper-300 bg-paper-50 p-4">
      <h2 id="recovery-title" className="font-semibold text-ink-800">
        Your recovery codes
      </h2>
      <p className="mt-1 text-sm text-ink-600">
        If you lose your phone, each of these signs you in once in place of a code. Keep them somewhere safe (a password manager, or
        printed and locked away); this is the only time they are shown.
      </p>
      <ul className="mt-3 grid grid-cols-2 gap-x-4 gap-y-1 font-mono text-sm text-ink-900" data-testid="recovery-codes">
        {codes.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  );
}
