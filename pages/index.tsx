import type { GetServerSideProps } from "next";
import Head from "next/head";
import { Landing, type LandingCatalogue } from "@/components/marketing/landing";
import { getDb } from "@/db/client";
import { listCurrentCells, listCurrentMaterials } from "@/db/queries/catalogue";

/**
 * `/`: the public landing page, rendered on the server per request (it reads the catalogue) and
 * sent with no client JavaScript at all. It lives in the pages router because only there can a
 * page leave out Next's client runtime (`unstable_runtimeJS: false`); an App Router page ships
 * React and the router (about 130 kB gzipped) whatever it contains. Everything else is App Router.
 */
export const config = { unstable_runtimeJS: false };

export const getServerSideProps: GetServerSideProps<LandingCatalogue> = async () => {
  const db = getDb();
  const [cells, materials] = await Promise.all([listCurrentCells(db).catch(() => []), listCurrentMaterials(db).catch(() => [])]);
  return {
    props: {
      cells: cells.map((c) => ({ key: c.key, params: c.params })),
      materials: materials.map((m) => ({ key: m.key, params: m.params })),
    },
  };
};

export default function LandingPage(props: LandingCatalogue) {
  return (
    <>
      <Head>
        <title>Layerwright — Ostrevane Additive Works</title>
        <meta name="description" content="Large-format printed tooling: send a CAD export, see whether it fits, what it costs and when it ships, and follow the job to delivery." />
        <meta name="application-name" content="Layerwright" />
        <meta name="theme-color" content="#181d23" />
        <link rel="manifest" href="/manifest.webmanifest" />
        <link rel="icon" href="/favicon.ico" sizes="16x16 32x32 48x48" />
        <link rel="icon" href="/icon.svg" type="image/svg+xml" />
        <link rel="apple-touch-icon" href="/apple-touch-icon.png" />
      </Head>
      <Landing {...props} />
    </>
  );
}
