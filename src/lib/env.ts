import { z } from "zod";

// The client's environment, checked once at start-up so a bad build fails loudly instead of
// calling the wrong place. Only VITE_* variables reach the browser.
const schema = z.object({
  MODE: z.string(),
  DEV: z.boolean(),
  VITE_API_BASE: z
    .string()
    .regex(/^\/[^/]/, "VITE_API_BASE must be a same-origin path such as /api")
    .default("/api"),
});

const parsed = schema.safeParse(import.meta.env);
if (!parsed.success) {
  throw new Error(`Client environment is invalid: ${parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
}

export const env = { mode: parsed.data.MODE, dev: parsed.data.DEV, apiBase: parsed.data.VITE_API_BASE };
