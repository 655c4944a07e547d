// Which page build the server names on /api/me (server/http/client-build.ts): the entry script of
// the built index.html, as Vite writes it; nothing for the development page.
import { describe, expect, it } from "vitest";
import { clientEntryOf } from "../../../server/http/client-build";

describe("clientEntryOf", () => {
  it("reads the module entry script of a built page, not its preloads or styles", () => {
    const html = `<head>
    <link rel="icon" type="image/svg+xml" href="/assets/mark-CmdLgp0s.svg" />
    <script type="module" crossorigin src="/assets/index-DX8lf1lL.js"></script>
    <link rel="modulepreload" crossorigin href="/assets/ui-AuP1fXPI.js">
    <link rel="stylesheet" crossorigin href="/assets/index-CqAQUWOS.css"></head>`;
    expect(clientEntryOf(html)).toBe("/assets/index-DX8lf1lL.js");
  });

  it("names nothing for the development page or a page without a module script", () => {
    expect(clientEntryOf(`<script type="module" src="/src/main.tsx"></script>`)).toBeNull();
    expect(clientEntryOf(`<html><body>Not built</body></html>`)).toBeNull();
  });
});
