import { defineConfig } from "vite";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";
import path from "node:path";

// In development Vite serves the client on :5173 and forwards /api to the Express server on :3000.
// In production Express serves the built dist/ itself, so the client always calls same-origin /api.
export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: {
      "@shared": path.resolve(import.meta.dirname, "shared"),
      "@": path.resolve(import.meta.dirname, "src"),
    },
  },
  server: {
    host: "127.0.0.1",
    port: 5173,
    strictPort: true,
    proxy: { "/api": { target: "http://127.0.0.1:3000" } },
  },
  // `vite preview` serves the built dist/ with the same /api forwarding, for checking a build.
  preview: { host: "127.0.0.1", port: 4173, strictPort: true, proxy: { "/api": { target: "http://127.0.0.1:3000" } } },
  worker: { format: "es" },
  build: { outDir: "dist", emptyOutDir: true, sourcemap: true },
});
