import { TZDate, tz } from "@date-fns/tz";
import { format, isValid, parseISO } from "date-fns";

/**
 * Every date and time on screen, in e-mails and in staff forms goes through this module, in the
 * plant's time zone, in one format: "7 Dec 2026" and "7 Dec 2026, 06:00 CST".
 *
 * The plant's zone (an IANA id). Read it from here only; when the bureau's calendar in the
 * catalogue carries its own zone, this constant is the one place to point at it.
 */
export const PLANT_TIME_ZONE = "America/Chicago";

type When = Date | string | number | null | undefined;

function toDate(v: When): Date | null {
  if (v === null || v === undefined || v === "") return null;
  const d = v instanceof Date ? v : typeof v === "number" ? new Date(v) : parseISO(v);
  return isValid(d) ? d : null;
}

/** The zone's short name at that instant ("CST", "CDT"), falling back to the offset ("GMT-6"). */
export function zoneLabel(at: Date = new Date(), timeZone: string = PLANT_TIME_ZONE): string {
  const part = new Intl.DateTimeFormat("en-US", { timeZone, timeZoneName: "short" }).formatToParts(at).find((p) => p.type === "timeZoneName");
  return part?.value ?? timeZone;
}

/** "7 Dec 2026" in the plant's zone; "—" for no date. */
export function formatDate(v: When, timeZone: string = PLANT_TIME_ZONE): string {
  const d = toDate(v);
  return d ? format(d, "d MMM yyyy", { in: tz(timeZone) }) : "—";
}

/** "Mon 7 Dec 2026": a day someone plans around (ship dates). */
export function formatDateLong(v: When, timeZone: string = PLANT_TIME_ZONE): string {
  const d = toDate(v);
  return d ? format(d, "EEE d MMM yyyy", { in: tz(timeZone) }) : "—";
}

/** "7 Dec 2026, 06:00 CST" in the plant's zone (24-hour clock, zone named). */
export function formatDateTime(v: When, timeZone: string = PLANT_TIME_ZONE): string {
  const d = toDate(v);
  return d ? `${format(d, "d MMM yyyy, HH:mm", { in: tz(timeZone) })} ${zoneLabel(d, timeZone)}` : "—";
}

/** "06:00" in the plant's zone, for labels where the day is already shown. */
export function formatTime(v: When, timeZone: string = PLANT_TIME_ZONE): string {
  const d = toDate(v);
  return d ? format(d, "HH:mm", { in: tz(timeZone) }) : "—";
}

/**
 * A calendar day stored as "YYYY-MM-DD" (a ship date, a needed-by date): a day, not an instant,
 * so it is shown as written, never shifted by a zone. A Date here is such a day kept as UTC
 * midnight (needed-by and quoted ship dates).
 */
export function formatDay(ymd: string | Date | null | undefined): string {
  if (!ymd) return "—";
  const m = /^(\d{4})-(\d{2})-(\d{2})/.exec(ymd instanceof Date ? ymd.toISOString() : ymd);
  if (!m) return "—";
  return format(new TZDate(Number(m[1]), Number(m[2]) - 1, Number(m[3]), "UTC"), "d MMM yyyy", { in: tz("UTC") });
}

/** Today's date in the plant ("YYYY-MM-DD"), for date inputs' defaults and minimums. */
export function plantToday(now: Date = new Date(), timeZone: string = PLANT_TIME_ZONE): string {
  return format(now, "yyyy-MM-dd", { in: tz(timeZone) });
}

/** The calendar day of an instant in the plant ("YYYY-MM-DD"). */
export function plantDay(v: When, timeZone: string = PLANT_TIME_ZONE): string | null {
  const d = toDate(v);
  return d ? format(d, "yyyy-MM-dd", { in: tz(timeZone) }) : null;
}

/** An instant as a `datetime-local` input's value, in the plant's zone ("2026-12-07T06:00"). */
export function toPlantInput(v: When, timeZone: string = PLANT_TIME_ZONE): string {
  const d = toDate(v);
  return d ? format(d, "yyyy-MM-dd'T'HH:mm", { in: tz(timeZone) }) : "";
}

/**
 * A `datetime-local` value typed by staff, read as the plant's wall-clock time, to the instant
 * it names. Null when it is not a date and time. (In a daylight-saving gap the clock is moved
 * forward, as the zone's rules do.)
 */
export function fromPlantInput(value: string, timeZone: string = PLANT_TIME_ZONE): Date | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(value.trim());
  if (!m) return null;
  const [y, mo, d, h, mi, s] = [m[1], m[2], m[3], m[4], m[5], m[6] ?? "0"].map(Number) as [number, number, number, number, number, number];
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 23 || mi > 59 || s > 59) return null;
  const at = new TZDate(y, mo - 1, d, h, mi, s, timeZone);
  if (at.getDate() !== d) return null; // 31 Feb and the like roll over: refuse them
  return new Date(at.getTime());
}

/** The next Monday at `hour` in the plant (a planner's usual first pick), as an instant. */
export function nextPlantMonday(now: Date, hour = 6, timeZone: string = PLANT_TIME_ZONE): Date {
  const local = new TZDate(now.getTime(), timeZone);
  const ahead = (8 - local.getDay()) % 7 || 7;
  return new Date(new TZDate(local.getFullYear(), local.getMonth(), local.getDate() + ahead, hour, 0, 0, timeZone).getTime());
}

/** A "YYYY-MM-DD" day moved by whole calendar days (no zone involved: a day is a day). */
export function addPlantDays(ymd: string, days: number): string {
  const [y, m, d] = ymd.split("-").map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d + days)).toISOString().slice(0, 10);
}
