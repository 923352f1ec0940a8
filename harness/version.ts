/** gridproof's version, recorded in every result (keep equal to package.json's). */
export const VERSION = "0.1.0";
