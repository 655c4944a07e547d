import prettyBytes from "pretty-bytes";

// Sizes as people read them on a phone, a drive or a price list: decimal SI prefixes, so a
// "MB" is 1,000,000 bytes (SI Brochure, 9th ed., Table 7; IEC 80000-13 keeps "MiB" for 2^20).
// The plans' storage and the upload limit are set in the same units, so the text and the limit
// never disagree ("4.0 GB" is 4,000,000,000 bytes everywhere). pretty-bytes does the formatting.

export const MB = 1e6;
export const GB = 1e9;
export const TB = 1e12;

/** "812 B", "45.0 kB", "48.2 MB", "1.07 GB", "250.0 GB", "1.0 TB". */
export const bytesText = (n: number): string =>
  n < 1000 ? `${Math.round(n)} B` : prettyBytes(n, { locale: "en-US", minimumFractionDigits: 1, maximumFractionDigits: 2 });
