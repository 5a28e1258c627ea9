/** Rounding of reported figures: to 0.01 and to 0.0001 of their unit. */
export const r2 = (v: number) => Math.round(v * 100) / 100;
export const r4 = (v: number) => Math.round(v * 1e4) / 1e4;
