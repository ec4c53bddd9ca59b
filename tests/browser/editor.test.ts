/**
 * The design editor through the real UI at a phone and a desktop width: enter a lead, see the
 * Bode plot, the pole–zero map and the drift table computed by the real compute API, save,
 * reopen (also after a reload), save a change as version 2, open version 1 read-only.
 */
import { AT_BOTH_WIDTHS, screenshot, useAppInBrowser } from '../helpers/browser';

jest.setTimeout(180_000);

const t = useAppInBrowser();
const { expectText } = t;

describe.each(AT_BOTH_WIDTHS)('design editor at %s width', (label, viewport) => {
  it('enters a lead, shows plots and drift, saves, reopens and versions it', async () => {
    const { page, errors } = await t.browser.newPage(viewport);
    const computeAnswers: number[] = [];
    page.on('response', (r) => {
      if (r.url().endsWith('/api/v1/discretize')) computeAnswers.push(r.status());
    });
    await t.openNewDesign(page, 'engineer@example.com');
    await page.getByTestId('lead-gain').fill('18');
    await page.getByTestId('lead-zero').fill('4');
    await page.getByTestId('lead-pole').fill('30');
    await page.getByTestId('sample-rate').fill('500');

    await page.getByTestId('bode-plot').waitFor();
    await page.getByTestId('zplane-plot').waitFor();
    const drift = page.getByTestId('drift-table');
    await drift.waitFor();
    const text = await drift.innerText();
    for (const m of [/Tustin/, /Prewarped/, /Matched/, /ZOH/, /Bwd Euler/]) expect(text).toMatch(m);
    expect(computeAnswers).toContain(200);
    // H(z) echoed: the Tustin pole of s = −30 at fs = 500 is z = (1 − 0.03)/(1 + 0.03) = 0.941748 (bilinear map)
    expect(await page.getByTestId('hz-echo').innerText()).toMatch(/0\.9417/);
    await screenshot(page, `editor-${label}-analysis`);

    const name = `Tilt lead ${label}`;
    await page.getByTestId('design-name').fill(name);
    await page.getByTestId('design-save').click();
    await page.waitForURL(/\/designs\/\d+/);
    await page.getByTestId('design-version').waitFor();
    expect(await page.getByTestId('design-version').innerText()).toMatch(/version 1/i);

    // reopen after a reload of the deep link: the same values come back from the server
    await page.reload();
    await page.getByTestId('lead-pole').waitFor();
    expect(await page.getByTestId('lead-pole').inputValue()).toBe('30');
    expect(await page.getByTestId('sample-rate').inputValue()).toBe('500');
    await page.getByTestId('drift-table').waitFor();

    await page.getByTestId('sample-rate').fill('1000');
    await page.getByTestId('design-save').click();
    await page.getByTestId('save-note').waitFor();
    await expectText(page, 'design-version', /version 2/i);

    await page.getByTestId('design-version-1').click();
    await page.getByTestId('read-only-banner').waitFor();
    expect(await page.getByTestId('sample-rate').inputValue()).toBe('500');
    await screenshot(page, `editor-${label}-version1`);

    // the implementation of the version shown is one step away
    await page.getByTestId('design-implement').click();
    await page.waitForURL(/\/implement\/\d+\?version=1/);
    await page.getByTestId('impl-screen').waitFor();

    // the list shows the design
    await page.goto(`${t.server.baseUrl}/designs`);
    await page.getByText(name).first().waitFor();
    expect(errors).toEqual([]);
    await page.close();
  });
});
