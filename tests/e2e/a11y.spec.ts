// The accessibility check bites: a page with faults is reported rule by rule, element by element,
// and a page.goto that lands on one fails. (Every other spec runs the same check through the
// fixtures; see a11y.ts and decision 016.)
import { A11yError, a11yViolations, expectAccessible } from "./a11y";
import { test, expect, A11Y_CHECK } from "./fixtures";

const FAULTS = `
  <div id="a11y-faults">
    <p style="color:#777a80;background:#6c6f75">Grey on grey</p>
    <img id="a11y-faults-img" src="data:image/gif;base64,R0lGODlhAQABAAAAACw=">
    <div aria-hidden="true"><button id="a11y-faults-hidden">Hidden yet focusable</button></div>
  </div>`;

test("the check names each broken rule, the element and what is wrong", async ({ page, signIn }) => {
  test.slow(); // scans called directly get no extra time from the fixture
  await signIn("demo-builder");
  await page.goto("/builds");
  expect(await a11yViolations(page)).toEqual([]);

  await page.locator("main").evaluate((main, html) => main.insertAdjacentHTML("beforeend", html), FAULTS);
  const ids = (await a11yViolations(page)).map((v) => v.id).sort();
  expect(ids).toEqual(["aria-hidden-focus", "color-contrast", "image-alt"]);

  const error = await expectAccessible(page, "in the injected faults").then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(A11yError);
  const message = (error as A11yError).message;
  expect(message).toContain("violations in the injected faults");
  expect(message).toMatch(/image-alt \(critical\): Images must have alternative text \[1 element\]\n {4}#a11y-faults-img\n {6}Fix any of the following:/);
  expect(message).toMatch(/color-contrast \(serious\).*\n {4}(#a11y-faults > )?p\n {6}Fix any of the following: Element has insufficient color contrast/);
  expect(message).toContain('div[aria-hidden="true"]');

  // Put the page right again: the fixture checks it once more when the test ends.
  await page.locator("#a11y-faults").evaluate((el) => el.remove());
});

test("a page.goto that lands on a page with faults fails the test that made it", async ({ page, signIn }) => {
  test.skip(!A11Y_CHECK, "the fixture's check is off (HB_A11Y=0)");
  test.slow(); // scans called directly get no extra time from the fixture
  await signIn("demo-builder");
  await page.route("**/a11y-faulty-page", (route) =>
    route.fulfill({
      status: 200,
      contentType: "text/html",
      body: `<!doctype html><html lang="en" data-hydrated><head><title>Faulty</title></head><body><main><h1>Faulty</h1>${FAULTS}</main></body></html>`,
    }),
  );
  const failure = await page.goto("/a11y-faulty-page").then(
    () => null,
    (e: unknown) => e,
  );
  expect(failure).toBeInstanceOf(A11yError);
  expect((failure as A11yError).message).toContain('after page.goto("/a11y-faulty-page")');
  expect((failure as A11yError).violations.map((v) => v.id).sort()).toEqual(["aria-hidden-focus", "color-contrast", "image-alt"]);
  // Leave on a page that passes; the faulty address, opened again at the end, is the app's own 404 page.
  await page.goto("/builds");
});
