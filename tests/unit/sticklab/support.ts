// Shared bits of the stick-lab tests: where the fixtures are, and how close is close.
import { fileURLToPath } from "node:url";

export const fixture = (name: string) => fileURLToPath(new URL(`../../fixtures/sticklab/${name}`, import.meta.url));
export const projectRoot = fileURLToPath(new URL("../../../", import.meta.url));

export const relErr = (got: number, want: number) => Math.abs(got - want) / Math.abs(want);

/** NIST's log relative error: the number of significant digits that agree. */
export const lre = (got: number, want: number) => (got === want ? 16 : -Math.log10(relErr(got, want)));
