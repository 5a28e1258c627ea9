import { Logo } from "@/components/brand/logo";
import { buttonClass } from "@/components/ui/button";
import type { CellParams, MaterialParams } from "@/lib/estimating/types";

/** The catalogue the landing page shows (current, active rows). */
export interface LandingCatalogue {
  cells: { key: string; params: CellParams }[];
  materials: { key: string; params: MaterialParams }[];
}

const STEPS = [
  { n: "01", title: "Upload a mesh", text: "STL, OBJ or 3MF exports of your mold, plug or fixture. We measure it on the spot: size, volume, watertightness." },
  { n: "02", title: "Grow the near-net shape", text: "The part is printed oversize by your finish allowance, typically a quarter inch, in large beads of fibre-filled thermoplastic." },
  { n: "03", title: "Print inside the cooling window", text: "Each layer is planned so the one below is firm enough to carry it, and still warm enough to bond." },
  { n: "04", title: "Machine to net", text: "A 5-axis router takes the allowance off and finishes the tool face at a stepover chosen for your surface." },
];

function metres(mm: number) {
  return (mm / 1000).toLocaleString("en-US", { maximumFractionDigits: 1 });
}

/**
 * The public landing page's body: plain markup, no hooks and no client component, so it renders
 * to HTML alone. Served by pages/index.tsx without Next's client runtime (links are plain
 * anchors; nothing on this page needs JavaScript).
 */
export function Landing({ cells: cellRows, materials: materialRows }: LandingCatalogue) {
  const volume = (e: { x: number; y: number; z: number }) => e.x * e.y * e.z;
  const cells = [...cellRows].sort((a, b) => volume(b.params.envelopeMm) - volume(a.params.envelopeMm));
  const materials = [...materialRows].sort((a, b) => a.params.maxServiceTempC - b.params.maxServiceTempC);
  return (
    <div>
      <header className="mx-auto flex max-w-6xl items-center justify-between px-5 py-5">
        <Logo />
        <nav className="flex items-center gap-2">
          <a href="/sign-in" className="px-3 py-2 text-sm font-medium text-ink-700 hover:text-kiln-700">
            Sign in
          </a>
          <a href="/sign-up" className={buttonClass("primary", "sm")}>
            Create an account
          </a>
        </nav>
      </header>

      <section className="bg-ink-800 text-paper-100">
        <div className="mx-auto grid max-w-6xl gap-10 px-5 py-16 md:grid-cols-[1.3fr_1fr] md:py-24">
          <div>
            <p className="text-sm font-semibold uppercase tracking-widest text-kiln-400">Ostrevane Additive Works</p>
            <h1 className="mt-3 text-4xl font-semibold leading-tight tracking-tight text-white md:text-5xl">
              Layup molds, master plugs and fixtures, printed big and machined true.
            </h1>
            <p className="mt-5 max-w-xl text-lg text-paper-200">
              Send the CAD export. Learn at once whether it fits our cells, what it weighs, roughly what it costs and when it can
              ship. Then follow the job through printing, machining, inspection and shipping.
            </p>
            <div className="mt-8 flex flex-wrap gap-3">
              <a href="/sign-up" className={buttonClass("primary", "lg")}>
                Check fit, cost and ship date
              </a>
              <a href="/sign-in" className={buttonClass("secondary", "lg")}>
                Sign in
              </a>
            </div>
          </div>
          <div aria-hidden="true" className="relative hidden md:block">
            <svg viewBox="0 0 340 260" className="h-full w-full">
              {Array.from({ length: 12 }, (_, i) => (
                <rect key={i} x={40 + (i % 2) * 4} y={220 - i * 16} width={200 - i * 6} height={13} rx={6.5} fill={i < 11 ? "#d9692a" : "#e98a4c"} opacity={0.45 + i * 0.045} />
              ))}
              <path d="M52 30 L52 230 M234 40 L200 230" stroke="#cfe9e6" strokeDasharray="4 5" strokeWidth={1.5} />
              <text x="246" y="60" fill="#cfe9e6" fontSize="11">net surface</text>
              <text x="246" y="76" fill="#cfe9e6" fontSize="11">+ allowance</text>
            </svg>
          </div>
        </div>
      </section>

      <section className="mx-auto max-w-6xl px-5 py-16">
        <h2 className="text-2xl font-semibold text-ink-900">Near-net, then net</h2>
        <ol className="mt-8 grid gap-6 sm:grid-cols-2 lg:grid-cols-4">
          {STEPS.map((s) => (
            <li key={s.n} className="border-t-4 border-kiln-500 pt-4">
              <span className="figures text-sm text-ink-400">{s.n}</span>
              <h3 className="mt-1 font-semibold text-ink-800">{s.title}</h3>
              <p className="mt-2 text-sm text-ink-600">{s.text}</p>
            </li>
          ))}
        </ol>
      </section>

      <section className="bg-paper-100">
        <div className="mx-auto grid max-w-6xl gap-10 px-5 py-16 lg:grid-cols-2">
          <div>
            <h2 className="text-2xl font-semibold text-ink-900">Printing cells</h2>
            <p className="mt-2 text-sm text-ink-600">Build envelopes, length × width × height. Longer parts can be printed in pieces and bonded.</p>
            <ul className="mt-6 space-y-3">
              {cells.map((c) => (
                <li key={c.key} className="rounded-md bg-white p-4 ring-1 ring-paper-200">
                  <div className="flex flex-wrap items-baseline justify-between gap-2">
                    <span className="font-semibold text-ink-800">{c.params.name}</span>
                    <span className="figures text-sm text-ink-600">
                      {metres(c.params.envelopeMm.y)} × {metres(c.params.envelopeMm.x)} × {metres(c.params.envelopeMm.z)} m
                    </span>
                  </div>
                  <p className="mt-1 text-sm text-ink-500">
                    about {c.params.extruderOutputKgPerH} kg/h · beads {Math.min(...c.params.beadWidthsMm)}–{Math.max(...c.params.beadWidthsMm)} mm
                    {c.params.screwMm ? ` · ${c.params.screwMm} mm screw` : ""}
                    {c.params.verticalPrint
                      ? ` · also builds vertically, parts up to ${metres(c.params.verticalPrint.longAxisMm)} m long in one piece`
                      : c.params.canPrintVertical ? " · prints vertically for long, thin parts" : ""}
                  </p>
                </li>
              ))}
            </ul>
          </div>
          <div>
            <h2 className="text-2xl font-semibold text-ink-900">Materials</h2>
            <p className="mt-2 text-sm text-ink-600">Fibre-filled thermoplastics, chosen for the cure your tool must survive.</p>
            <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 mt-6 overflow-x-auto rounded-md bg-white ring-1 ring-paper-200">
              <table className="min-w-full text-sm">
                <thead className="bg-paper-50 text-left text-xs uppercase tracking-wide text-ink-500">
                  <tr>
                    <th className="px-4 py-2">Material</th>
                    <th className="px-4 py-2 text-right">Max service</th>
                    <th className="px-4 py-2 text-right">Density</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-paper-200">
                  {materials.map((m) => (
                    <tr key={m.key}>
                      <td className="px-4 py-2 font-medium text-ink-800">{m.params.name}</td>
                      <td className="figures px-4 py-2 text-right">
                        {m.params.maxServiceTempC} °C / {Math.round((m.params.maxServiceTempC * 9) / 5 + 32)} °F
                      </td>
                      <td className="figures px-4 py-2 text-right">{m.params.densityGPerCm3.toFixed(2)} g/cm³</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            <p className="mt-3 text-xs text-ink-500">
              Service temperatures are the bureau&apos;s guidance. A tool run above its material&apos;s rating can deform or fail under
              autoclave pressure: the tool&apos;s use stays with your own engineering sign-off.
            </p>
          </div>
        </div>
      </section>

      <footer className="mx-auto max-w-6xl px-5 py-10 text-sm text-ink-500">
        Ostrevane Additive Works · Layerwright client portal. Large printed tools are heavy and parts leave the cell hot: our
        pickup and lifting notes apply, and local codes come first.
      </footer>
    </div>
  );
}
