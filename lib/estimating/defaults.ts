import type { CellParams, MaterialParams, RateCardParams, WorkingCalendar } from "./types";

/**
 * The demo catalogue of Ostrevane Additive Works (invented scenario of DESIGN.md), used by the
 * seed and by the CLI when no database is present. Cell sizes and outputs are invented (DESIGN.md).
 *
 * Each row's `source` is the bureau engineer's note as staff read it on the catalogue page. Where
 * the figures really come from (checks.md rows; "memory" = recalled, not read in a source;
 * "common practice" = trade rule of thumb; "invented" = the scenario's own prices and policy):
 * - every material: density, Tg/Tm, drying and melt ranges: memory (checks.md, Materials), except
 *   PETG/GF's Tg 66 °C (DSC) and melt 220–250 °C: Martin et al., Polymers 2024, 16(13):1913 (the
 *   30 % CF grade's values, used for this glass-filled grade); prices: invented.
 * - expansion: CF-ABS 5–15 along / 60–100+ across ppm/K: memory (checks.md); CF-PA6 ≈ 22 ppm/K
 *   along: Faust et al., Polymers 2021, 13, 3637; the others: memory (PC/CF taken as CF-ABS).
 * - service limit = Tg − 20…30 °C: common practice (checks.md); PPS/CF ≈ 177 °C from a 2016 trade
 *   magazine report of printed PPS/CF molds surviving 350 °F / 90 psi autoclave cycles of 2–3 h;
 *   PA6/CF: memory.
 * - layer-time windows: Compton et al. 2017 (memory of its findings) and common practice.
 * - rate card: rates, fees, times, rib grid and skins, plant zone, shift start and closed dates:
 *   invented; half deposit, 0.25 in allowance, 5–10 % stepover: common practice (checks.md);
 *   lifting caution at 23 kg: load constant of the revised lifting equation (memory); 12.7 mm net
 *   wall: common practice; a bead bridges about 3 bead widths: memory.
 */

const weekdaysTwoShifts: WorkingCalendar = { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: [] };

// Hourly print rates per cell: demo figures of the invented bureau (a larger cell costs more an
// hour and lays more per hour). Head accelerations: a few hundred to about 1000 mm/s² on large
// gantries (memory, not read in a source); a lighter gantry accelerates harder.
//
// Extruders: a 40 mm-class screw lays about 90 kg/h and a 60 mm-class one about 225 kg/h of a
// commodity polymer, less of an engineering and a high-temperature one (common practice, from
// memory; the per-family figures and the smaller screws' are the invented bureau's, scaled from
// those). Barrel limits: the hottest melt each cell reaches (invented; the high-temperature grades
// need 330–400 °C, typical processing ranges from memory). Dryers: two hoppers a cell, each sized
// as a hopper dryer usually is, near output × drying time (common practice), so the longer-drying
// grades (PA/CF, 8 h) are fed no faster than hopper ÷ hours (invented capacities).
// The flagship cell prints horizontally on a 6 m bed and vertically along its 12 m rail, layers
// stacked along the rail inside its 3 × 2.4 m cross travel (invented figures).

export const defaultCells: CellParams[] = [
  {
    key: "long-bed", name: "Long Bed",
    envelopeMm: { x: 3600, y: 9000, z: 1800 },
    extruderOutputKgPerH: 90,
    screwMm: 40, outputKgPerHByFamily: { commodity: 90, engineering: 75, "high-temp": 60 },
    maxMeltTempC: 400, dryer: { hoppers: 2, hopperKg: 400 },
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
    extruderOutputKgPerH: 50,
    screwMm: 30, outputKgPerHByFamily: { commodity: 50, engineering: 42, "high-temp": 35 },
    maxMeltTempC: 400, dryer: { hoppers: 2, hopperKg: 250 },
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
    screwMm: 25, outputKgPerHByFamily: { commodity: 25, engineering: 21, "high-temp": 18 },
    maxMeltTempC: 320, dryer: { hoppers: 2, hopperKg: 150 },
    beadWidthsMm: [10, 12, 15], layerHeightsMm: [3, 4, 5],
    defaultBeadWidthMm: 12, defaultLayerHeightMm: 4,
    speedMinMmS: 30, speedMaxMmS: 200,
    canPrintVertical: false,
    calendar: weekdaysTwoShifts,
    printRateCentsPerH: 14_500,
    accelerationMmS2: 800,
  },
  {
    key: "long-axis", name: "Long Axis",
    envelopeMm: { x: 3000, y: 6000, z: 2400 },
    extruderOutputKgPerH: 225,
    screwMm: 60, outputKgPerHByFamily: { commodity: 225, engineering: 190, "high-temp": 150 },
    maxMeltTempC: 420, dryer: { hoppers: 2, hopperKg: 1200 },
    verticalPrint: { longAxisMm: 12_000, sectionMm: { x: 3000, y: 2400 } },
    beadWidthsMm: [20, 25], layerHeightsMm: [5, 6, 8, 10],
    defaultBeadWidthMm: 25, defaultLayerHeightMm: 8,
    speedMinMmS: 30, speedMaxMmS: 250,
    canPrintVertical: true,
    calendar: weekdaysTwoShifts,
    printRateCentsPerH: 29_000,
    accelerationMmS2: 300,
  },
];

// Layer-time windows: minimum 1–3 min for CF-ABS-class beads (Compton et al. 2017, memory of its
// findings; common practice for the minutes); maximum = the bureau's limit before the surface
// falls too far below Tg (common practice). Service limit = Tg − 20…30 °C (common practice).
export const defaultMaterials: MaterialParams[] = [
  {
    key: "abs-cf", name: "ABS/CF (20 % carbon fibre)",
    family: "commodity",
    densityGPerCm3: 1.15, pricePerKgCents: 1400,
    meltTempMinC: 230, meltTempMaxC: 260, dryingTempC: 80, dryingHours: 3,
    glassTransitionC: 105, maxServiceTempC: 80,
    cteAlongPpmPerK: 10, cteAcrossPpmPerK: 80,
    minLayerTimeS: 90, maxLayerTimeS: 600,
    notes: "General tooling, trim and drill fixtures, room-temperature and low-temperature cure.",
    source: "Density, glass transition (about 105 °C), drying and melt range: typical values for 20 % carbon-fibre ABS pellets; check each lot's certificate. Expansion about 5–15 ppm/K along the bead and 60–100 ppm/K across it, as printed CF-ABS usually measures. Service limit: glass transition less 25 °C, our rule for printed tools. Layer time: at least 1.5 min so the layer below firms up, at most 10 min so it is still warm enough to bond. Price: our current purchase price per kg, delivered.",
  },
  {
    key: "pc-cf", name: "PC/CF",
    family: "engineering",
    densityGPerCm3: 1.3, pricePerKgCents: 2200,
    meltTempMinC: 280, meltTempMaxC: 310, dryingTempC: 120, dryingHours: 4,
    glassTransitionC: 147, maxServiceTempC: 120,
    cteAlongPpmPerK: 12, cteAcrossPpmPerK: 70,
    minLayerTimeS: 90, maxLayerTimeS: 540,
    notes: "Oven-cure tooling near 120 °C with care; check against the cure cycle.",
    source: "Density, glass transition (about 147 °C), drying and melt range: typical values for carbon-fibre polycarbonate pellets; check each lot's certificate. Expansion: taken as for printed CF-ABS until our own coupons are measured. Service limit: glass transition less 25 °C, our rule for printed tools. Layer time window: our usual one for amorphous carbon-fibre grades. Price: our current purchase price per kg, delivered.",
  },
  {
    key: "petg-gf", name: "PETG/GF",
    family: "commodity",
    densityGPerCm3: 1.35, pricePerKgCents: 1100,
    meltTempMinC: 220, meltTempMaxC: 250, dryingTempC: 65, dryingHours: 5,
    glassTransitionC: 66, maxServiceTempC: 45,
    cteAlongPpmPerK: 20, cteAcrossPpmPerK: 70,
    minLayerTimeS: 60, maxLayerTimeS: 600,
    notes: "Low-cost patterns and fixtures; not for heated cure.",
    source: "Glass transition 66 °C (by DSC) and melt range 220–250 °C: published figures for fibre-filled PETG; density and drying: typical values for filled PETG pellets. Expansion: typical of printed filled PETG. Service limit: glass transition less 20 °C, our rule for printed tools. Price: our current purchase price per kg, delivered.",
  },
  {
    key: "pa-cf", name: "PA/CF (PA6)",
    family: "engineering",
    densityGPerCm3: 1.25, pricePerKgCents: 2400,
    meltTempMinC: 250, meltTempMaxC: 280, dryingTempC: 80, dryingHours: 8,
    glassTransitionC: 60, maxServiceTempC: 120,
    cteAlongPpmPerK: 22, cteAcrossPpmPerK: 90,
    minLayerTimeS: 60, maxLayerTimeS: 480,
    notes: "Semi-crystalline (Tm ≈ 220 °C): usable above Tg; absorbs moisture, dry well.",
    source: "Density, melting point (about 220 °C), drying and melt range: typical values for carbon-fibre PA6 pellets; check each lot's certificate. Expansion about 22 ppm/K along the bead (published for printed CF-PA) and far more across it. Service limit: usual for semi-crystalline CF-PA6 tools, dried before use. Layer time window: our usual one for semi-crystalline grades. Price: our current purchase price per kg, delivered.",
  },
  {
    key: "pps-cf", name: "PPS/CF",
    family: "high-temp",
    densityGPerCm3: 1.5, pricePerKgCents: 5200,
    meltTempMinC: 300, meltTempMaxC: 330, dryingTempC: 130, dryingHours: 4,
    glassTransitionC: 90, maxServiceTempC: 180,
    cteAlongPpmPerK: 12, cteAcrossPpmPerK: 60,
    minLayerTimeS: 60, maxLayerTimeS: 420,
    notes: "Semi-crystalline (Tm ≈ 280 °C). Printed PPS/CF molds survived 350 °F / 90 psi cycles of 2–3 h.",
    source: "Density, glass transition (about 90 °C), melting point (about 280 °C), drying and melt range: typical values for carbon-fibre PPS pellets; check each lot's certificate. Service limit about 180 °C: printed PPS/CF molds have been reported to survive repeated 177 °C (350 °F), 6 bar (90 psi) autoclave cycles of 2–3 h. Expansion: typical of printed CF-PPS. Layer time window: our usual one for semi-crystalline grades. Price: our current purchase price per kg, delivered.",
  },
  {
    key: "psu-cf", name: "PSU/CF",
    family: "high-temp",
    densityGPerCm3: 1.32, pricePerKgCents: 6800,
    meltTempMinC: 330, meltTempMaxC: 370, dryingTempC: 140, dryingHours: 4,
    glassTransitionC: 187, maxServiceTempC: 160,
    cteAlongPpmPerK: 8, cteAcrossPpmPerK: 50,
    minLayerTimeS: 60, maxLayerTimeS: 420,
    notes: "Amorphous; autoclave tooling below about 160 °C.",
    source: "Density, glass transition (about 187 °C), drying and melt range: typical values for carbon-fibre PSU pellets; check each lot's certificate. Service limit: glass transition less 27 °C, our rule for printed tools. Expansion: typical of printed CF-PSU. Layer time window: our usual one for high-temperature amorphous grades. Price: our current purchase price per kg, delivered.",
  },
  {
    key: "pesu-cf", name: "PESU/CF",
    family: "high-temp",
    densityGPerCm3: 1.47, pricePerKgCents: 8200,
    meltTempMinC: 340, meltTempMaxC: 380, dryingTempC: 165, dryingHours: 5,
    glassTransitionC: 225, maxServiceTempC: 195,
    cteAlongPpmPerK: 8, cteAcrossPpmPerK: 50,
    minLayerTimeS: 60, maxLayerTimeS: 360,
    notes: "Amorphous; 350 °F (177 °C) autoclave cure.",
    source: "Density, glass transition (about 225 °C), drying and melt range: typical values for carbon-fibre PESU pellets; check each lot's certificate. Service limit: glass transition less 30 °C, our rule for printed tools. Expansion: typical of printed CF-PESU. Layer time window: our usual one for high-temperature amorphous grades. Price: our current purchase price per kg, delivered.",
  },
  {
    key: "pei-cf", name: "PEI/CF",
    family: "high-temp",
    densityGPerCm3: 1.38, pricePerKgCents: 9500,
    meltTempMinC: 340, meltTempMaxC: 400, dryingTempC: 150, dryingHours: 5,
    glassTransitionC: 217, maxServiceTempC: 190,
    cteAlongPpmPerK: 7, cteAcrossPpmPerK: 45,
    minLayerTimeS: 60, maxLayerTimeS: 360,
    notes: "Amorphous; 350 °F (177 °C) autoclave cure.",
    source: "Density, glass transition (about 217 °C), drying and melt range: typical values for carbon-fibre PEI pellets; check each lot's certificate. Service limit: glass transition less 27 °C, our rule for printed tools. Expansion: typical of printed CF-PEI. Layer time window: our usual one for high-temperature amorphous grades. Price: our current purchase price per kg, delivered.",
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
  freight: {
    // Zones and rates: demo values of the invented bureau, shipping from its one plant.
    zones: [
      { key: "zone-1", name: "Zone 1, plant region", regions: ["US-TX", "US-OK", "US-LA", "US-AR", "US-KS", "US-MO"], baseCents: 30_000, centsPerKg: 95, flatbedSurchargeCents: 85_000, transitDays: 2 },
      { key: "zone-2", name: "Zone 2, central states", regions: ["US-NM", "US-CO", "US-NE", "US-IA", "US-IL", "US-MS", "US-AL", "US-TN", "US-KY", "US-IN", "US-WI", "US-MN", "US-SD", "US-ND"], baseCents: 42_000, centsPerKg: 130, flatbedSurchargeCents: 120_000, transitDays: 3 },
      { key: "zone-3", name: "Zone 3, rest of the mainland", regions: ["US"], baseCents: 55_000, centsPerKg: 170, flatbedSurchargeCents: 165_000, transitDays: 5 },
      { key: "zone-4", name: "Zone 4, Alaska, Hawaii, Canada and Mexico", regions: ["US-AK", "US-HI", "CA", "MX"], baseCents: 90_000, centsPerKg: 260, flatbedSurchargeCents: 240_000, transitDays: 8 },
      { key: "zone-5", name: "Zone 5, overseas by sea", regions: ["*"], baseCents: 180_000, centsPerKg: 320, flatbedSurchargeCents: 400_000, transitDays: 30 },
    ],
    defaultZoneKey: "zone-3",
    dimKgPerM3: 333,
    crateTareKgPerM3: 45,
    closedTrailer: { lengthMm: 15_900, widthMm: 2_490, heightMm: 2_690, maxKg: 20_000 },
  },
  marginBp: 2_500, taxBp: 0, depositBp: 5_000,
  quoteValidityDays: 30, defaultAllowanceMm: 6.35,
  coolingHoursBase: 4, coolingHoursPerKg: 0.02, coolingHoursMax: 48,
  finishingDays: 2, inspectionDays: 1, packingDays: 1,
  liftingCautionKg: 23,
  printSetupHours: 2,
  // removal: about an hour to lift a large print with the crane (common practice); delivery choices
  // (lib/estimating/lead-times.ts): overtime at time and a half (common practice), the rest the bureau's own
  removalHours: 1, overtimePremiumBp: 5_000, expediteFeeCents: 25_000, economyDiscountBp: 500, economyExtraDays: 10, economyMaxLoadBp: 6_000,
  shellNetWallMm: 12.7, ribSpacingMm: 400, ribBeads: 1, skinLayers: 3, maxBridgeMm: 60,
  plantTimeZone: "CST6CDT", shiftStartHour: 6,
  holidays: ["2026-12-24", "2026-12-25", "2026-12-31", "2027-01-01", "2027-05-31", "2027-07-05", "2027-09-06", "2027-11-25", "2027-11-26", "2027-12-24"],
  source: "Rates, fees and lead times: our standard price list for 2027. Deposit: half on acceptance, the balance on shipment. Finish allowance 6.35 mm (0.25 in) and a machining stepover of 5–10 % of the cutter: usual practice for machined printed tools. Lifting caution from 23 kg: the load constant of the revised lifting equation; heavier parts are lifted with rated equipment. Shell: 12.7 mm (0.5 in) net wall after machining, a 400 mm rib grid one bead wide, 3-layer skins. A bead bridges about 3 bead widths (60 mm) unsupported; wider flat tops get support ribs. Plant calendar: Central time, first shift at 06:00, closed on the dates listed. Delivery: expedited work on extra shifts and weekends at time and a half on set-up and machining plus a flat 250.00 for finishing, inspection and packing; economy 5 % off for ten working days more while the cells have room. Freight: per crate and per billable kg by destination zone; billable mass at 333 kg/m³; a crate no closed trailer takes goes on a flatbed at the zone's surcharge.",
};
