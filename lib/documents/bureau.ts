import type { Party } from "./types";

/**
 * The bureau's own details as printed on every document (invented, like all demo data). One
 * place, so a change of name or address is one edit; issued documents keep what they printed.
 */
export const BUREAU = {
  name: "Ostrevane Additive Works",
  lines: ["Bay 3, Cinderwick Trading Estate", "Orlen Vale, OV4 7QX", "Tax registration OAW-4417-2093", "accounts@ostrevane.example"],
  bank: "Pay by card from the order page; bank details on request from accounts@ostrevane.example.",
} as const;

export const bureauParty = (): Party => ({ name: BUREAU.name, lines: [...BUREAU.lines] });
