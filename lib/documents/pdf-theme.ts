import { Font, StyleSheet } from "@react-pdf/renderer";
import path from "node:path";

/**
 * The layout every issued document shares, drawn with @react-pdf/renderer from the frozen
 * snapshot (lib/documents/types.ts). Fonts ship with the app (Inter, SIL Open Font License, from
 * the npm package @fontsource/inter): nothing is fetched at render time.
 */
const FONT_DIR = path.join(process.cwd(), "lib", "documents", "fonts");
let fontsRegistered = false;
export function registerFonts() {
  if (fontsRegistered) return;
  Font.register({
    family: "Inter",
    fonts: [
      { src: path.join(FONT_DIR, "inter-latin-400-normal.woff"), fontWeight: 400 },
      { src: path.join(FONT_DIR, "inter-latin-700-normal.woff"), fontWeight: 700 },
    ],
  });
  // Long words (file names, ids) wrap at any character instead of overflowing the column.
  Font.registerHyphenationCallback((word) => (word.length > 24 ? word.split("") : [word]));
  fontsRegistered = true;
}

export const KILN = "#d9692a";
export const INK = "#181d23";
export const MUTED = "#6b7480";
export const RULE = "#e8e3d7";

export const s = StyleSheet.create({
  page: { fontFamily: "Inter", fontSize: 9, color: INK, paddingTop: 36, paddingBottom: 56, paddingHorizontal: 40, lineHeight: 1.35 },
  band: { height: 5, backgroundColor: KILN, marginBottom: 14 },
  row: { flexDirection: "row" },
  head: { flexDirection: "row", justifyContent: "space-between", marginBottom: 16 },
  bureauName: { fontSize: 13, fontWeight: 700, lineHeight: 1.3, marginBottom: 2 },
  muted: { color: MUTED },
  title: { fontSize: 18, fontWeight: 700, textAlign: "right", lineHeight: 1.2 },
  number: { fontSize: 11, fontWeight: 700, textAlign: "right", marginTop: 4, lineHeight: 1.2 },
  metaLine: { textAlign: "right", color: MUTED },
  partyBox: { flex: 1, paddingRight: 12 },
  label: { fontSize: 7, color: MUTED, textTransform: "uppercase", letterSpacing: 0.6, marginBottom: 2 },
  bold: { fontWeight: 700 },
  table: { marginTop: 14, borderTopWidth: 1, borderTopColor: INK },
  th: { flexDirection: "row", borderBottomWidth: 1, borderBottomColor: RULE, paddingVertical: 4, fontWeight: 700, fontSize: 8 },
  tr: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: RULE, paddingVertical: 4 },
  cDesc: { flex: 1, paddingRight: 6 },
  cQty: { width: 40, textAlign: "right" },
  cMoney: { width: 78, textAlign: "right" },
  totals: { marginTop: 8, marginLeft: "auto", width: 230 },
  totalRow: { flexDirection: "row", justifyContent: "space-between", paddingVertical: 2 },
  grand: { flexDirection: "row", justifyContent: "space-between", paddingVertical: 4, marginTop: 2, borderTopWidth: 1, borderTopColor: INK, fontWeight: 700, fontSize: 10.5 },
  section: { marginTop: 16 },
  h2: { fontSize: 10, fontWeight: 700, marginBottom: 4 },
  caution: { marginTop: 16, borderWidth: 1, borderColor: KILN, backgroundColor: "#fdf2ea", padding: 8 },
  stamp: { marginTop: 10, alignSelf: "flex-start", borderWidth: 1.5, borderColor: "#2f7d6d", color: "#2f7d6d", paddingVertical: 3, paddingHorizontal: 8, fontWeight: 700 },
  footer: { position: "absolute", bottom: 24, left: 40, width: 515, fontSize: 7, color: MUTED },
});

export const day = (iso: string | null) =>
  iso ? new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" }).format(new Date(iso)) : "—";
export const qty = (n: number) => (Number.isInteger(n) ? String(n) : n.toFixed(2));
export const pct = (bp: number) => `${(bp / 100).toLocaleString("en-US", { maximumFractionDigits: 2 })}%`;
