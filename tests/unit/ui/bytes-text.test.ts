import { describe, expect, it } from "vitest";
import { bytesText, GB, MB } from "../../../shared/bytes";
import { formatBytes } from "../../../src/features/clips/format";
import { PLANS, storageText } from "../../../shared/billing/plans";

// SI prefixes are powers of ten (SI Brochure, 9th ed., Table 7); IEC 80000-13 names the binary
// multiples MiB/GiB. A file a phone lists as "48.2 MB" (48,200,000 bytes) must read the same here.
describe("sizes in decimal units", () => {
  it("a MB is 1,000,000 bytes and a GB 1,000,000,000", () => {
    expect(bytesText(48_200_000)).toBe("48.2 MB");
    expect(bytesText(1_000_000)).toBe("1.0 MB");
    expect(bytesText(4 * GB)).toBe("4.0 GB");
    expect(bytesText(250 * GB)).toBe("250.0 GB");
    expect(bytesText(1e12)).toBe("1.0 TB");
    expect(bytesText(812)).toBe("812 B");
    expect(bytesText(45_000)).toBe("45.0 kB");
  });
  it("a binary mebibyte is not shown as a whole MB", () => {
    expect(bytesText(1024 ** 2)).toBe("1.04 MB"); // pretty-bytes cuts, not rounds, past two decimals
    expect(bytesText(1024 ** 3)).toBe("1.07 GB");
    expect(bytesText(300 * MB)).toBe("300.0 MB");
  });
  it("the client, the plans and the server read the same", () => {
    expect(formatBytes(48_200_000)).toBe("48.2 MB");
    expect(formatBytes(null)).toBe("—");
    expect(storageText(PLANS.pond.storageBytes)).toBe("5.0 GB");
    expect(storageText(PLANS.arena.storageBytes)).toBe("1.0 TB");
  });
});
