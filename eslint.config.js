// Lint: the general recommended rules plus the layering rules of docs/decisions/120-layering-rules.md.
// A rule that blocks you means the design needs a new home for something, not a disable comment.
import js from "@eslint/js";
import tseslint from "typescript-eslint";
import { importX } from "eslint-plugin-import-x";
import { createTypeScriptImportResolver } from "eslint-import-resolver-typescript";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import { readdirSync } from "node:fs";

const features = readdirSync(new URL("./src/features", import.meta.url), { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);

/** Node's I/O modules: shared/ runs in the browser and in workers too. */
const nodeIo = ["fs", "fs/*", "path", "os", "child_process", "net", "http", "https", "stream", "worker_threads", "cluster", "dgram", "dns", "tls", "readline", "zlib", "process"];
const nodeIoPatterns = [...nodeIo, ...nodeIo.map((m) => `node:${m}`)];

/**
 * Files that may import Drizzle: the entity modules (server/entities/<entity>/) own their tables,
 * their queries and the SQL forms of their rules; server/db holds the schema, the client, the
 * migrator and the reads of pg-boss's own tables; server/seed writes the demo club's rows, as
 * tests set up theirs (docs/decisions/126-server-entity-layer.md).
 */
export const drizzleAllowed = ["server/entities/**", "server/db/**", "server/seed/**"];

const drizzleMessage =
  "Only the entity modules (server/entities/<entity>/) and server/db talk to Drizzle: call the entity module instead (docs/decisions/120-layering-rules.md).";

export default tseslint.config(
  { ignores: ["dist/**", "node_modules/**", "drizzle/**", ".data/**", "uploads/**", "test-results/**", "playwright-report/**", "docker/**"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ["**/*.{ts,tsx,js}"],
    plugins: { "import-x": importX },
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    settings: {
      ...importX.flatConfigs.typescript.settings,
      "import-x/resolver-next": [createTypeScriptImportResolver({ project: "./tsconfig.json" })],
    },
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none" }],
      // Express's Request is extended the way its types document: a global namespace declaration.
      "@typescript-eslint/no-namespace": ["error", { allowDeclarations: true }],
      "import-x/no-cycle": ["error", { ignoreExternal: true }],
      "import-x/no-self-import": "error",
    },
  },
  {
    files: ["src/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks },
    rules: { "react-hooks/rules-of-hooks": "error", "react-hooks/exhaustive-deps": "error" },
  },
  // Tests read untyped JSON answers; `any` is their honest type there.
  { files: ["tests/**/*.ts"], rules: { "@typescript-eslint/no-explicit-any": "off" } },
  // Client: app → features → entities → components / lib / shared. Features never import each other.
  ...features.map((feature) => ({
    files: [`src/features/${feature}/**/*.{ts,tsx}`],
    rules: {
      "import-x/no-restricted-paths": [
        "error",
        {
          zones: [
            {
              target: `./src/features/${feature}`,
              from: "./src/features",
              except: [`./${feature}`],
              message: "Features never import each other: move what both need into src/entities/ or src/components/.",
            },
          ],
        },
      ],
    },
  })),
  {
    files: ["src/{entities,components,lib}/**/*.{ts,tsx}"],
    rules: {
      "import-x/no-restricted-paths": [
        "error",
        {
          zones: [
            { target: "./src/entities", from: ["./src/features", "./src/app"], message: "Entities sit below features and the app shell." },
            { target: "./src/components", from: ["./src/features", "./src/app"], message: "Shared UI sits below features and the app shell." },
            { target: "./src/lib", from: ["./src/features", "./src/app"], message: "src/lib sits below features and the app shell." },
          ],
        },
      ],
    },
  },
  // shared/: pure code both sides run. No DOM (its tsconfig has no DOM lib) and no Node I/O.
  {
    files: ["shared/**/*.ts"],
    languageOptions: { globals: { ...globals["shared-node-browser"] } },
    rules: {
      "no-restricted-globals": [
        "error",
        ...["process", "Buffer", "require", "__dirname", "document", "window", "localStorage", "fetch"].map((name) => ({
          name,
          message: "shared/ is pure: no DOM, no Node process or I/O (pass values in).",
        })),
      ],
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            { group: nodeIoPatterns, message: "shared/ does no I/O: pass data in from server/ or src/." },
            { group: ["@/*", "**/server/**", "**/src/**"], message: "shared/ imports only shared/ and packages." },
          ],
        },
      ],
    },
  },
  // Server: only entity repositories and server/db import Drizzle.
  {
    files: ["server/**/*.{ts,tsx}"],
    ignores: drizzleAllowed,
    rules: {
      "no-restricted-imports": ["error", { patterns: [{ group: ["drizzle-orm", "drizzle-orm/*"], message: drizzleMessage }] }],
    },
  },
);
