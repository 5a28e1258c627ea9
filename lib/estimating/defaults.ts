import type { CellParams, MaterialParams, RateCardParams, WorkingCalendar } from "./types";

/**
 * The demo catalogue of Ostrevane Additive Works (invented scenario of DESIGN.md), used by the
 * seed and by the CLI when no database is present. Material figures come from
 * /work/shared/reference/checks.md; each material's `source` says where each value is from
 * ("memory" = recalled, not read; "common practice" = trade rule of thumb; "demo" = invented
 * price or bureau policy). Cell sizes and outputs are invented (DESIGN.md).
 */

const weekdaysTwoShifts: WorkingCalendar = { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: [] };

// Hourly print rates per cell: demo figures of the invented bureau (a larger cell costs more an
// hour and lays more per hour). Head accelerations: a few hundred to about 1000 mm/s² on large
// gantries (memory, not read in a source); a lighter gantry accelerates harder.

export const defaultCells: CellParams[] = [
  {
    key: "long-bed", name: "Long Bed",
    envelopeMm: { x: 3600, y: 9000, z: 1800 },
    extruderOutputKgPerH: 70,
    beadWidthsMm: [18, 20, 25], layerHeightsMm: [5, 6, 8],
    defaultBeadWidthMm: 20, defaultLayerHeightMm: 5,
    // speed range inside the trade's ~30–250 mm/s (checks.md, common practice)
    speedMinMmS: 30, speedMaxMmS: 250,
    canPrintVertical: false,
    calendar: weekdaysTwoShifts,
    printRateCentsPerH: 24_000,
    accelerationMmS2: 400,
  },
  {
    key: "tall-frame", name: "Tall Frame",
    envelopeMm: { x: 2400, y: 4800, z: 2400 },
    extruderOutputKgPerH: 45,
    beadWidthsMm: [15, 18, 20], layerHeightsMm: [4, 5, 6],
    defaultBeadWidthMm: 18, defaultLayerHeightMm: 5,
    speedMinMmS: 30, speedMaxMmS: 200,
    canPrintVertical: true,
    calendar: weekdaysTwoShifts,
    printRateCentsPerH: 19_500,
    accelerationMmS2: 500,
  },
  {
    key: "compact", name: "Compact",
    envelopeMm: { x: 1800, y: 3000, z: 1200 },
    extruderOutputKgPerH: 25,
    beadWidthsMm: [10, 12, 15], layerHeightsMm: [3, 4, 5],
    defaultBeadWidthMm: 12, defaultLayerHeightMm: 4,
    speedMinMmS: 30, speedMaxMmS: 200,
    canPrintVertical: false,
    calendar: weekdaysTwoShifts,
    printRateCentsPerH: 14_500,
    accelerationMmS2: 800,
  },
];

// Layer-time windows: minimum 1–3 min for CF-ABS-class beads (Compton et al. 2017, memory of its
// findings; common practice for the minutes); maximum = the bureau's limit before the surface
// falls too far below Tg (common practice). Service limit = Tg − 20…30 °C (common practice).
export const defaultMaterials: MaterialParams[] = [
  {
    key: "abs-cf", name: "ABS/CF (20 % carbon fibre)",
    densityGPerCm3: 1.15, pricePerKgCents: 1400,
    meltTempMinC: 230, meltTempMaxC: 260, dryingTempC: 80, dryingHours: 3,
    glassTransitionC: 105, maxServiceTempC: 80,
    cteAlongPpmPerK: 10, cteAcrossPpmPerK: 80,
    minLayerTimeS: 90, maxLayerTimeS: 600,
    notes: "General tooling, trim and drill fixtures, room-temperature and low-temperature cure.",
    source: "density, Tg, drying, melt: memory (checks.md); CTE along 5–15 / across 60–100+ ppm/K: memory (checks.md); service = Tg − 25 °C: common practice; layer window: Compton et al. 2017 (memory) and common practice; price: demo",
  },
  {
    key: "pc-cf", name: "PC/CF",
    densityGPerCm3: 1.3, pricePerKgCents: 2200,
    meltTempMinC: 280, meltTempMaxC: 310, dryingTempC: 120, dryingHours: 4,
    glassTransitionC: 147, maxServiceTempC: 120,
    cteAlongPpmPerK: 12, cteAcrossPpmPerK: 70,
    minLayerTimeS: 90, maxLayerTimeS: 540,
    notes: "Oven-cure tooling near 120 °C with care; check against the cure cycle.",
    source: "density, Tg, drying, melt: memory (checks.md); CTE: memory, same class as printed CF-ABS; service = Tg − 25 °C: common practice; layer window: common practice; price: demo",
  },
  {
    key: "petg-gf", name: "PETG/GF",
    densityGPerCm3: 1.35, pricePerKgCents: 1100,
    meltTempMinC: 220, meltTempMaxC: 250, dryingTempC: 65, dryingHours: 5,
    glassTransitionC: 66, maxServiceTempC: 45,
    cteAlongPpmPerK: 20, cteAcrossPpmPerK: 70,
    minLayerTimeS: 60, maxLayerTimeS: 600,
    notes: "Low-cost patterns and fixtures; not for heated cure.",
    source: "Tg 66 °C (DSC) and melt 220–250 °C: Martin et al., Polymers 2024, 16(13):1913 (values for the 30 % CF grade in checks.md, used for this glass-filled grade); density, drying: memory; CTE: memory; service = Tg − 20 °C: common practice; price: demo",
  },
  {
    key: "pa-cf", name: "PA/CF (PA6)",
    densityGPerCm3: 1.25, pricePerKgCents: 2400,
    meltTempMinC: 250, meltTempMaxC: 280, dryingTempC: 80, dryingHours: 8,
    glassTransitionC: 60, maxServiceTempC: 120,
    cteAlongPpmPerK: 22, cteAcrossPpmPerK: 90,
    minLayerTimeS: 60, maxLayerTimeS: 480,
    notes: "Semi-crystalline (Tm ≈ 220 °C): usable above Tg; absorbs moisture, dry well.",
    source: "density, Tm, drying, melt: memory (checks.md); CTE along ≈ 22 ppm/K: Faust et al., Polymers 2021, 13, 3637; across: memory; service limit: memory; layer window: common practice; price: demo",
  },
  {
    key: "pps-cf", name: "PPS/CF",
    densityGPerCm3: 1.5, pricePerKgCents: 5200,
    meltTempMinC: 300, meltTempMaxC: 330, dryingTempC: 130, dryingHours: 4,
    glassTransitionC: 90, maxServiceTempC: 180,
    cteAlongPpmPerK: 12, cteAcrossPpmPerK: 60,
    minLayerTimeS: 60, maxLayerTimeS: 420,
    notes: "Semi-crystalline (Tm ≈ 280 °C). Printed PPS/CF molds survived 350 °F / 90 psi cycles of 2–3 h.",
    source: "density, Tg, Tm, drying, melt: memory (checks.md); autoclave cycles: CompositesWorld, \"3-D printing autoclavable composite molds\" (2016); service ≈ 177 °C from those cycles; CTE: memory; layer window: common practice; price: demo",
  },
  {
    key: "psu-cf", name: "PSU/CF",
    densityGPerCm3: 1.32, pricePerKgCents: 6800,
    meltTempMinC: 330, meltTempMaxC: 370, dryingTempC: 140, dryingHours: 4,
    glassTransitionC: 187, maxServiceTempC: 160,
    cteAlongPpmPerK: 8, cteAcrossPpmPerK: 50,
    minLayerTimeS: 60, maxLayerTimeS: 420,
    notes: "Amorphous; autoclave tooling below about 160 °C.",
    source: "density, Tg, drying, melt: memory (checks.md); service = Tg − 27 °C: common practice; CTE: memory; layer window: common practice; price: demo",
  },
  {
    key: "pesu-cf", name: "PESU/CF",
    densityGPerCm3: 1.47, pricePerKgCents: 8200,
    meltTempMinC: 340, meltTempMaxC: 380, dryingTempC: 165, dryingHours: 5,
    glassTransitionC: 225, maxServiceTempC: 195,
    cteAlongPpmPerK: 8, cteAcrossPpmPerK: 50,
    minLayerTimeS: 60, maxLayerTimeS: 360,
    notes: "Amorphous; 350 °F (177 °C) autoclave cure.",
    source: "density, Tg, drying, melt: memory (checks.md); service = Tg − 30 °C: common practice; CTE: memory; layer window: common practice; price: demo",
  },
  {
    key: "pei-cf", name: "PEI/CF",
    densityGPerCm3: 1.38, pricePerKgCents: 9500,
    meltTempMinC: 340, meltTempMaxC: 400, dryingTempC: 150, dryingHours: 5,
    glassTransitionC: 217, maxServiceTempC: 190,
    cteAlongPpmPerK: 7, cteAcrossPpmPerK: 45,
    minLayerTimeS: 60, maxLayerTimeS: 360,
    notes: "Amorphous; 350 °F (177 °C) autoclave cure.",
    source: "density, Tg, drying, melt: memory (checks.md); service = Tg − 27 °C: common practice; CTE: memory; layer window: common practice; price: demo",
  },
];

export const defaultRateCard: RateCardParams = {
  key: "standard-2027", name: "Standard rates", currency: "usd",
  printRateCentsPerH: 18_500, dwellRateCentsPerH: 6_500,
  machiningRateCentsPerH: 16_000, engineeringRateCentsPerH: 14_000,
  engineeringHoursPerPart: 3, setupFeeCents: 45_000,
  purgeKg: 4, startupScrapFraction: 0.03,
  roughingRemovalMm3PerMin: 400_000, finishingFeedMmPerMin: 5_000,
  cutterRadiusMm: 6.35, targetScallopMm: 0.0254,
  toolChangeMinutes: 5, toolChangeCount: 4, machiningSetupHours: 2,
  sealingCoatCentsPerM2: 9_500, vacuumTestCents: 35_000,
  crateBaseCents: 25_000, crateCentsPerKg: 150, crateCentsPerM3: 9_000, cratePaddingMm: 100,
  freightBaseCents: 40_000, freightCentsPerKg: 120,
  marginBp: 2_500, taxBp: 0, depositBp: 5_000,
  quoteValidityDays: 30, defaultAllowanceMm: 6.35,
  coolingHoursBase: 4, coolingHoursPerKg: 0.02, coolingHoursMax: 48,
  finishingDays: 2, inspectionDays: 1, packingDays: 1,
  liftingCautionKg: 23,
  printSetupHours: 2,
  shellNetWallMm: 12.7, ribSpacingMm: 400, ribBeads: 1, skinLayers: 3, maxBridgeMm: 60,
  plantTimeZone: "CST6CDT", shiftStartHour: 6,
  holidays: ["2026-12-24", "2026-12-25", "2026-12-31", "2027-01-01", "2027-05-31", "2027-07-05", "2027-09-06", "2027-11-25", "2027-11-26", "2027-12-24"],
  source: "rates, fees and times: demo values of the invented bureau; deposit half up front, 0.25 in allowance, 5–10 % stepover: common practice (checks.md); lifting caution at 23 kg: the load constant of the NIOSH revised lifting equation (memory); shell net wall 12.7 mm (0.5 in) after machining: common practice; rib grid 400 mm, one bead wide, 3-layer skins: demo values; a bead bridges about 3 bead widths (60 mm) unsupported: memory; plant zone, 06:00 shift start and closed dates: demo",
};
