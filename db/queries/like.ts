/** A user's search text as a literal inside a LIKE pattern (%, _ and \ escaped). */
export const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);
