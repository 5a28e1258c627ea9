import type { Role, Stage } from "@/db/schema/common";
import type { CureProcess } from "@/db/schema/requests";

/**
 * The invented demo scenario of DESIGN.md: Ostrevane Additive Works and three client firms.
 * Every name here is made up. Demo passwords are printed by the seed and listed in the README.
 */
export const DEMO_PASSWORDS: Record<Role, string> = {
  admin: "demo-admin-2026",
  sales: "demo-sales-2026",
  production: "demo-production-2026",
  accounts: "demo-accounts-2026",
  client_admin: "demo-lead-2026",
  client: "demo-client-2026",
};

/**
 * Demo staff's authenticator secrets (base32; staff must sign in with a code). Add one to an
 * authenticator app by hand, or print the current code with `npm run demo:code -- EMAIL`; the
 * browser tests compute codes from them. Invented values, for the demo only.
 */
export const DEMO_TOTP_SECRETS: Record<string, string> = {
  "admin@ostrevane.example": "KRSXG5CBMRWWS3RAIRSW23ZAKNSWG4TF",
  "sales@ostrevane.example": "KRSXG5CTMFWGK4ZAIRSW23ZAKNSWG4TF",
  "production@ostrevane.example": "KRSXG5CQOJXWI5LDORUW63RAIRSW23ZA",
  "accounts@ostrevane.example": "KRSXG5CBMNRW65LOORZSARDFNVXSAU3F",
};

export const FIRMS = [
  { key: "caldrith", name: "Caldrith Aerostructures", slug: "caldrith-aerostructures", unitsPref: "mm" as const, billingContact: "Accounts payable, Caldrith Aerostructures" },
  { key: "bramblewake", name: "Bramblewake Boatworks", slug: "bramblewake-boatworks", unitsPref: "in" as const, billingContact: "Yard office, Bramblewake Boatworks" },
  { key: "tarnavel", name: "Tarnavel Polytechnic Composites Lab", slug: "tarnavel-composites-lab", unitsPref: "mm" as const, billingContact: "Lab purchasing, Tarnavel Polytechnic" },
] as const;
export type FirmKey = (typeof FIRMS)[number]["key"];

interface DemoAddress {
  label: string;
  attention?: string;
  line1: string;
  line2?: string;
  city: string;
  region: string;
  postalCode: string;
  deliveryNotes?: string;
  phone?: string;
}

/** Invented addresses (towns coined; state codes and ZIP formats real). The first shipping address is the default. */
export const FIRM_ADDRESSES: Record<FirmKey, { billing: DemoAddress; shipping: DemoAddress[] }> = {
  caldrith: {
    billing: { label: "Head office", attention: "Accounts payable", line1: "2200 Aerodrome Parkway", city: "Harrowmere", region: "KS", postalCode: "67290" },
    shipping: [{ label: "Tooling hall", attention: "Receiving, dock 3", line1: "2240 Aerodrome Parkway", line2: "Building 7", city: "Harrowmere", region: "KS", postalCode: "67290", deliveryNotes: "Dock open 06:00 to 14:00; forklift to 5 t on site", phone: "+1 316 555 0142" }],
  },
  bramblewake: {
    billing: { label: "Yard office", attention: "Yard office", line1: "1 Slipway Road", city: "Saltcombe Reach", region: "ME", postalCode: "04590" },
    shipping: [
      { label: "North yard", attention: "Plug shop", line1: "1 Slipway Road", city: "Saltcombe Reach", region: "ME", postalCode: "04590", deliveryNotes: "Gantry crane 10 t; call the yard an hour ahead", phone: "+1 207 555 0198" },
      { label: "Gulf yard", attention: "Mold loft", line1: "48 Bayou Quay", city: "Pellmoor", region: "LA", postalCode: "70397", deliveryNotes: "Flatbed access by the east gate", phone: "+1 985 555 0117" },
    ],
  },
  tarnavel: {
    billing: { label: "Purchasing", attention: "Lab purchasing", line1: "Quillbridge Hall, 9 College Row", city: "Fennick Cross", region: "MN", postalCode: "55990" },
    shipping: [{ label: "Composites lab", attention: "Ines Varrow", line1: "Engineering annex, 9 College Row", city: "Fennick Cross", region: "MN", postalCode: "55990", deliveryNotes: "Loading bay behind the annex; no forklift over 2 t" }],
  },
};

export const DEMO_USERS: { email: string; name: string; role: Role; firm?: FirmKey; cleared?: boolean; unitsPref?: "mm" | "in" }[] = [
  { email: "admin@ostrevane.example", name: "Wren Halloway", role: "admin", cleared: true },
  { email: "sales@ostrevane.example", name: "Ivo Marchetti-Lund", role: "sales", cleared: true },
  { email: "production@ostrevane.example", name: "Tamsin Okoro-Bell", role: "production", cleared: false },
  { email: "accounts@ostrevane.example", name: "Priya Castellane", role: "accounts" },
  { email: "lead@caldrith.example", name: "Jonah Feldvik", role: "client_admin", firm: "caldrith" },
  { email: "engineer@caldrith.example", name: "Mara Quistley", role: "client", firm: "caldrith" },
  { email: "buyer@bramblewake.example", name: "Callum Ashgrove", role: "client_admin", firm: "bramblewake", unitsPref: "in" },
  { email: "lab@tarnavel.example", name: "Ines Varrow", role: "client_admin", firm: "tarnavel" },
];

export type DemoMeshKey = "layup-mold" | "hull-plug" | "drill-fixture" | "too-long-beam" | "trim-fixture";

export interface DemoRequest {
  project: string;
  firm: FirmKey;
  by: string;
  stage: Stage;
  /** For on_hold: the stage it was held from. */
  heldFrom?: Stage;
  cure: CureProcess;
  cureTempC: number | null;
  partCte?: number;
  controlled?: boolean;
  mesh: DemoMeshKey;
  material: string;
  allowanceMm?: number;
  units?: "mm" | "in";
  quantity?: number;
  /** Shell print with this many walls; solid when absent. */
  shellWalls?: number;
  notes?: string;
  daysAgo: number;
  /** A refund made on the paid balance after delivery (the order lists its credit note). */
  refund?: { cents: number; reason: string };
  /** Paid on the firm's account (net terms, no deposit, invoiced at shipping) or the deposit by bank transfer; card when absent. */
  payment?: "account" | "transfer";
}

/** Firms accounts approved for net terms, with their credit limits (invented figures). */
export const FIRM_TERMS: Partial<Record<FirmKey, { terms: "net30" | "net45" | "net60"; limitCents: number; po: string }>> = {
  caldrith: { terms: "net30", limitCents: 25_000_000, po: "CA-PO" },
  tarnavel: { terms: "net45", limitCents: 6_000_000, po: "TPL-PO" },
};

/** A firm's approved tax-exemption certificate (an invented number and authority). */
export const FIRM_TAX_EXEMPTIONS: Partial<Record<FirmKey, { certificateNumber: string; issuedBy: string; validDays: number }>> = {
  tarnavel: { certificateNumber: "EX-5512-0471", issuedBy: "State revenue department, educational exemption", validDays: 400 },
};

/** One request in every stage, spread over the three firms. */
export const DEMO_REQUESTS: DemoRequest[] = [
  { project: "Spar cap tool — long span", firm: "caldrith", by: "engineer@caldrith.example", stage: "draft", cure: "autoclave", cureTempC: 177, partCte: 3, mesh: "too-long-beam", material: "pesu-cf", daysAgo: 1, notes: "Longer than any cell; expect a split." },
  { project: "Inlet duct layup tool", firm: "caldrith", by: "engineer@caldrith.example", stage: "submitted", cure: "autoclave", cureTempC: 177, partCte: 3, controlled: true, mesh: "layup-mold", material: "pesu-cf", daysAgo: 3 },
  { project: "Deck hatch plug", firm: "bramblewake", by: "buyer@bramblewake.example", stage: "quoted", cure: "room", cureTempC: null, mesh: "hull-plug", material: "abs-cf", units: "in", shellWalls: 3, allowanceMm: 6.35, daysAgo: 6 },
  { project: "Composite coupon drill fixture", firm: "tarnavel", by: "lab@tarnavel.example", stage: "accepted", cure: "oven", cureTempC: 120, mesh: "drill-fixture", material: "petg-gf", daysAgo: 9, notes: "Budget-limited; solid print is fine." },
  { project: "Access panel layup tool", firm: "caldrith", by: "lead@caldrith.example", stage: "deposit_paid", cure: "autoclave", cureTempC: 177, partCte: 3, mesh: "layup-mold", material: "psu-cf", daysAgo: 14 },
  { project: "Fairing trim fixture", firm: "caldrith", by: "engineer@caldrith.example", stage: "scheduled", cure: "room", cureTempC: null, mesh: "trim-fixture", material: "abs-cf", daysAgo: 18 },
  { project: "Transom plug, 28 ft hull", firm: "bramblewake", by: "buyer@bramblewake.example", stage: "printing", cure: "room", cureTempC: null, mesh: "hull-plug", material: "abs-cf", units: "in", shellWalls: 3, daysAgo: 22 },
  { project: "Wing-to-body fairing mold", firm: "caldrith", by: "lead@caldrith.example", stage: "cooling", cure: "oven", cureTempC: 120, partCte: 3, mesh: "layup-mold", material: "pc-cf", daysAgo: 26 },
  { project: "Sandwich panel press fixture", firm: "tarnavel", by: "lab@tarnavel.example", stage: "machining", cure: "oven", cureTempC: 90, mesh: "drill-fixture", material: "pa-cf", daysAgo: 30, payment: "transfer" },
  { project: "Radome layup tool", firm: "caldrith", by: "engineer@caldrith.example", stage: "inspection", cure: "autoclave", cureTempC: 177, partCte: 3, controlled: true, mesh: "layup-mold", material: "pei-cf", daysAgo: 34 },
  { project: "Console mold, centre console", firm: "bramblewake", by: "buyer@bramblewake.example", stage: "finishing", cure: "room", cureTempC: null, mesh: "hull-plug", material: "abs-cf", units: "in", shellWalls: 3, daysAgo: 40 },
  { project: "Stiffener drill jig", firm: "caldrith", by: "lead@caldrith.example", stage: "packed", cure: "room", cureTempC: null, mesh: "drill-fixture", material: "pc-cf", daysAgo: 44, payment: "account" },
  { project: "Cockpit liner plug", firm: "bramblewake", by: "buyer@bramblewake.example", stage: "shipped", cure: "room", cureTempC: null, mesh: "hull-plug", material: "abs-cf", units: "in", shellWalls: 3, daysAgo: 50 },
  { project: "Tensile coupon layup plate", firm: "tarnavel", by: "lab@tarnavel.example", stage: "delivered", cure: "oven", cureTempC: 120, mesh: "trim-fixture", material: "pps-cf", daysAgo: 58, payment: "account" },
  { project: "Flap track fairing tool", firm: "caldrith", by: "lead@caldrith.example", stage: "closed", cure: "autoclave", cureTempC: 177, partCte: 3, mesh: "layup-mold", material: "pesu-cf", daysAgo: 75, refund: { cents: 43_500, reason: "Freight: the tool shared a truck with another load; the difference is returned." } },
  { project: "Bow thruster tunnel plug", firm: "bramblewake", by: "buyer@bramblewake.example", stage: "on_hold", heldFrom: "quoted", cure: "room", cureTempC: null, mesh: "hull-plug", material: "abs-cf", units: "in", shellWalls: 3, daysAgo: 12, notes: "On hold while the yard confirms the hull lines." },
  { project: "Antenna bracket fixture", firm: "tarnavel", by: "lab@tarnavel.example", stage: "cancelled", cure: "room", cureTempC: null, mesh: "drill-fixture", material: "petg-gf", daysAgo: 20 },
  // A second, autoclave request on a material rated below the cure: the portal warns.
  { project: "Nacelle inner skin tool (trial)", firm: "caldrith", by: "engineer@caldrith.example", stage: "draft", cure: "autoclave", cureTempC: 177, partCte: 3, mesh: "layup-mold", material: "abs-cf", daysAgo: 0 },
];
