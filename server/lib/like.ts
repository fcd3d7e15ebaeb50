/** A search word matched literally inside ILIKE '%…%': its own %, _ and backslash are escaped (backslash is ILIKE's escape character). */
export const likeLiteral = (word: string) => word.replace(/[\\%_]/g, (c) => `\\${c}`);
