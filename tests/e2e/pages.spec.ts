import AxeBuilder from "@axe-core/playwright";
import { expect, test } from "@playwright/test";
import { mainPages, openSettled, SIZES } from "./support/pages";
import { signIn } from "./support/sign-in";

// Every main page, as the team admin (who can open all of them) and as a player, at a desktop,
// a 1024×768 tablet and a 390×844 phone: nothing may push the page sideways (the document's
// scroll width stays within the viewport). Each page is opened once and the window resized
// through the three sizes. axe-core must find no serious or critical accessibility problem: on
// every page the admin opens, at desktop size, and on every page the player opens, at phone size
// (the phone menu and the tables as cards). The tablet shares the desktop's layout.

const people = [
  { who: "team admin", email: "admin@ravens.example", axeAt: "desktop", atLeast: 14 },
  { who: "player", email: "player@ravens.example", axeAt: "phone", atLeast: 8 },
] as const;

for (const person of people)
  test(`${person.who}: no page scrolls sideways at desktop, tablet or phone size; no serious axe finding at ${person.axeAt} size`, async ({ browser }) => {
    test.setTimeout(240_000);
    const context = await browser.newContext({ viewport: { width: SIZES[0].width, height: SIZES[0].height }, hasTouch: true });
    const page = await context.newPage();
    await signIn(page, person.email);
    const paths = await mainPages(page);
    expect(paths.length).toBeGreaterThanOrEqual(person.atLeast);
    const overflow: string[] = [];
    const findings: string[] = [];
    for (const path of paths) {
      await page.setViewportSize({ width: SIZES[0].width, height: SIZES[0].height });
      await openSettled(page, path);
      for (const size of SIZES) {
        await page.setViewportSize({ width: size.width, height: size.height });
        const scroll = await page.evaluate(() => new Promise<number>((done) => requestAnimationFrame(() => requestAnimationFrame(() => done(document.documentElement.scrollWidth)))));
        if (scroll > size.width) overflow.push(`${path} at ${size.name} size: ${scroll} px wide in a ${size.width} px viewport`);
        if (size.name !== person.axeAt) continue;
        const r = await new AxeBuilder({ page }).options({ resultTypes: ["violations"] }).analyze();
        for (const v of r.violations.filter((x) => x.impact === "serious" || x.impact === "critical"))
          findings.push(`${path} at ${size.name} size: ${v.impact} ${v.id} — ${v.nodes.map((n) => n.target.join(" ")).slice(0, 4).join(", ")}`);
      }
    }
    expect(overflow, "pages wider than the screen").toEqual([]);
    expect(findings, "serious or critical axe-core findings").toEqual([]);
    await context.close();
  });
