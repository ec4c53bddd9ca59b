/**
 * Lead placement and the op-amp entry through the real UI at a phone and a desktop width: an
 * engineer enters a plant, places the closed-loop poles for a target ζ, ωn, uses the lead and
 * sees the drift table; then enters an op-amp network and sees H(s) echoed by the compute API.
 */
import { AT_BOTH_WIDTHS, screenshot, useAppInBrowser } from '../helpers/browser';

jest.setTimeout(180_000);

const t = useAppInBrowser();
const { expectText } = t;

describe.each(AT_BOTH_WIDTHS)('pole placement and op-amp entry at %s width', (label, viewport) => {
  it('places a lead for ζ, ωn, uses it, and enters an op-amp network', async () => {
    const { page, errors } = await t.browser.newPage(viewport);
    await t.openNewDesign(page, 'engineer@example.com');

    // the panel asks for the plant, then uses the editor's plant: G(s) = 6/(s(s + 3))
    await page.getByTestId('place-add-plant').click();
    await page.getByTestId('plant-num').fill('6');
    await page.getByTestId('plant-den').fill('1, 3, 0');
    await page.getByTestId('place-zeta').fill('0.6');
    await page.getByTestId('place-wn').fill('5');
    await page.getByTestId('place-run').click();
    await page.getByTestId('place-result').waitFor();
    // hand derivation in tests/unit/lead-placement: z = 25/7 = 3.57143, p = 7, K = 14/3 = 4.66667,
    // φ = atan(3/4) = 36.87°, closed-loop poles −4 and −3 ± j4
    const result = await page.getByTestId('place-result').innerText();
    expect(result).toMatch(/3\.57143/);
    expect(result).toMatch(/4\.66667/);
    expect(result).toMatch(/36\.87/);
    expect(result).toMatch(/−4\b/);
    await screenshot(page, `placement-${label}-result`);

    await page.getByTestId('place-use').click();
    expect(Number(await page.getByTestId('lead-gain').inputValue())).toBeCloseTo(14 / 3, 10);
    expect(Number(await page.getByTestId('lead-zero').inputValue())).toBeCloseTo(25 / 7, 10);
    expect(Number(await page.getByTestId('lead-pole').inputValue())).toBeCloseTo(7, 10);

    await page.getByTestId('sample-rate').fill('200');
    const drift = page.getByTestId('drift-table');
    await drift.waitFor();
    expect(await drift.innerText()).toMatch(/Tustin/);
    await screenshot(page, `placement-${label}-drift`);

    // the op-amp form: R1 = 47k, C1 = 1u, R2 = 4k7, C2 = 1u, R3 = 10k, R4 = 22k →
    // zero 1/(R1C1) = 21.2766 rad/s, pole 1/(R2C2) = 212.766 rad/s, gain R4C1/(R3C2) = 2.2 (entry.ts)
    await page.getByTestId('entry-form-op-amp').click();
    for (const [id, v] of [['opamp-r1', '47k'], ['opamp-c1', '1u'], ['opamp-r2', '4k7'], ['opamp-c2', '1u'], ['opamp-r3', '10k'], ['opamp-r4', '22k']]) {
      await page.getByTestId(id).fill(v);
    }
    await expectText(page, 'opamp-hs', /2\.2 \(s \+ 21\.2766\) \/ \(s \+ 212\.766\)/);
    await expectText(page, 'opamp-hs', /lead/);
    // the compute API's echo of what it understood
    await expectText(page, 'tf-echo', /21\.2766/);
    await expectText(page, 'tf-echo', /212\.766/);
    expect(await page.getByTestId('place-panel').count()).toBe(0);
    await screenshot(page, `placement-${label}-opamp`);
    expect(errors).toEqual([]);
    await page.close();
  });
});
