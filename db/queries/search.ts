import "server-only";
import { sql, type SQL, type SQLWrapper } from "drizzle-orm";

/** `%`, `_` and the escape character itself, escaped with a backslash for LIKE … ESCAPE '\'. */
export function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/**
 * `column` contains `text` (ASCII case-insensitive, as SQLite's LIKE): the text's own `%` and `_`
 * are matched literally, so a search for "10%" finds "10%" and not every "10".
 */
export function containsText(column: SQLWrapper, text: string): SQL {
  return sql`${column} LIKE ${`%${escapeLike(text)}%`} ESCAPE '\\'`;
}
