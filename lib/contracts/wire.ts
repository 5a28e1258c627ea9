import { z } from "zod";

/**
 * What a route sends, as the browser reads it: JSON, so a timestamp arrives as an ISO string.
 * The handler may hand a Date where the contract says string (JSON turns it into one).
 */
export type AsSent<T> = T extends string ? string | Date : T extends (infer U)[] ? AsSent<U>[] : T extends object ? { [K in keyof T]: AsSent<T[K]> } : T;

/** A timestamp on the wire (ISO 8601). */
export const wireDate = z.string();

/** A list route's answer: the page of rows and how many match in all; paged lists say which page. */
export const listAnswer = <R extends z.ZodType>(row: R) => z.object({ rows: z.array(row), total: z.number().int() });
export const pagedAnswer = <R extends z.ZodType>(row: R) => listAnswer(row).extend({ page: z.number().int(), pageSize: z.number().int() });

/** A zod enum of a label table's keys (lib/labels.ts), so a state the screens cannot name fails the contract. */
export const keysOf = <K extends string>(labels: Record<K, string>) => z.enum(Object.keys(labels) as [K, ...K[]]);
