/** Stored with every result; bump when any result for the same document would change. */
export const ENGINE_VERSION = "mechanics-1.2.0";
