/**
 * Figures the engine uses for a rate card saved before they existed (no imports: the catalogue
 * form shows them too). Removal: about an hour to lift a large print with the crane (common
 * practice). Delivery choices: overtime at time and a half (a 50 % premium) is common practice for
 * extra shifts and weekends; the flat fee for finishing, inspection and packing on overtime, the
 * economy discount (5 % for ten working days more) and the load under which it is offered (60 %
 * of working hours booked) are the bureau's own figures.
 */
export const REMOVAL_FALLBACK_H = 1;
export const LEAD_TIME_FALLBACKS = { overtimePremiumBp: 5000, expediteFeeCents: 25_000, economyDiscountBp: 500, economyExtraDays: 10, economyMaxLoadBp: 6000 };
