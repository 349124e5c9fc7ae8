/**
 * A DATETIME column as the API's ISO 8601 text, formatted by the database: the columns hold UTC (the connection's
 * time zone is +00:00) to the second, so this is exactly `Date#toISOString()` without a Date made per value.
 */
export const isoText = (column: string) => `DATE_FORMAT(${column}, '%Y-%m-%dT%H:%i:%s.000Z')`;
