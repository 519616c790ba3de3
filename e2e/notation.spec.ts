import { expect, test, type Locator, type Page } from '@playwright/test';
import {
  BUSY_MACHINE_MS,
  cutDone,
  failOnConsoleErrors,
  mapDone,
  pointAt,
  typeCutLine,
} from './demoPage';

failOnConsoleErrors();

/**
 * Spellings the app's one notation replaces: u⊥, u_z, E_Z, Delta_V, B⊥, E_X are typeset (a
 * subscript reads as plain letters in innerText: u_z as "uz").
 */
const OTHER_SPELLINGS = /u_perp|uPerp|u ⊥|u_z|E_Z|Delta_V|Δ_V|B_perp|E_X|u_\{/;

/** A panel's text as typeset, without form fields (plain text by nature: choices, typed CSV). */
async function typesetText(panel: Locator): Promise<string> {
  return panel.evaluate((el) => {
    const copy = el.cloneNode(true) as Element;
    copy.querySelectorAll('select, textarea, input').forEach((s) => s.remove());
    return copy.textContent ?? '';
  });
}

async function pinTyped(page: Page, x: number, y: number): Promise<void> {
  await page.getByTestId('pin-entry-x').fill(String(x));
  await page.getByTestId('pin-entry-y').fill(String(y));
  await page.getByTestId('pin-entry-submit').click();
}

test('one notation: the Cut runs along the swept coupling, every symbol is typeset alike, and names explain themselves on hover and focus', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);

  // A line at fixed u_z: its horizontal axis is u⊥ from -1 to 1, not t from 0 to 1.
  const cut = page.getByTestId('cut');
  await typeCutLine(page, ['-1', '1.5'], ['1', '1.5']);
  await cutDone(page);
  const note = cut.getByTestId('cut-axis-note');
  await expect(note).toHaveAttribute('data-label', 'u_perp');
  await expect(note).toContainText('u⊥');
  const ticks = await cut
    .locator('g.cut-axis[transform] .tick text')
    .evaluateAll((ts) => ts.map((t) => t.textContent ?? '').filter((s) => s !== ''));
  const values = ticks.map((t) => Number(t.replace('−', '-')));
  expect(Math.min(...values)).toBeCloseTo(-1, 9);
  expect(Math.max(...values)).toBeCloseTo(1, 9);
  // Both coordinates change: the distance along the line, in coupling units.
  await cut.getByTestId('cut-to-y').fill('0.5');
  await cutDone(page);
  await expect(note).toHaveAttribute('data-label', 'distance');

  // The state under the pointer, the legend, the Map's axes and the Cut use one spelling.
  await page.getByTestId('map-plot').scrollIntoViewIfNeeded();
  const [hx, hy] = await pointAt(page, -0.5, 1.5);
  await page.mouse.move(hx, hy);
  await expect(page.getByTestId('readout-phase')).toHaveText('CAF');
  const panels = {
    readout: page.getByTestId('readout'),
    legend: page.getByTestId('legend'),
    map: page.getByTestId('map'),
    cut: page.getByTestId('cut'),
    setup: page.locator('.setup-column'),
  };
  for (const [id, panel] of Object.entries(panels)) {
    // The text as typeset, without the choices of a select (plain text by nature, where u_z
    // and E_Z are the plain-text forms).
    const text = await panel.evaluate((el) => {
      const copy = el.cloneNode(true) as Element;
      copy.querySelectorAll('select').forEach((s) => s.remove());
      return copy.textContent ?? '';
    });
    expect(text, `${id} spells a symbol otherwise`).not.toMatch(OTHER_SPELLINGS);
  }
  // The readout's axis names: u with the subscripts ⊥ and z.
  const subscripts = await page
    .getByTestId('readout')
    .locator('.readout-position dt sub')
    .allTextContents();
  expect(subscripts).toEqual(['⊥', 'z']);

  // Every order-parameter group of the readout carries its explanation.
  const groups = page.getByTestId('readout').locator('th .term');
  expect(await groups.count()).toBe(8);
  for (const text of await groups.evaluateAll((ts) =>
    ts.map((t) => t.getAttribute('data-explain')),
  )) {
    expect(text!.length).toBeGreaterThan(10);
  }

  // A phase label of the legend explains itself on hover, another on keyboard focus.
  const legendF = page.locator('[data-testid="legend-entry"][data-label="F"] .term').first();
  await legendF.hover();
  const tip = page.getByTestId('term-tip');
  await expect(tip).toContainText('ferromagnet');
  await expect(legendF).toHaveAttribute('aria-describedby', 'term-tip');
  const legendKD = page.locator('[data-testid="legend-entry"][data-label="KD"] .term').first();
  await legendKD.focus();
  await expect(tip).toHaveText((await legendKD.getAttribute('data-explain'))!);
  await expect(tip).toContainText('Kekule');
});

test('one notation in the Observations panel, its fit results, the Probe and the pins side by side', async ({
  page,
}) => {
  await page.goto('/');
  await mapDone(page);

  // Two pins: F at (0.5, 1.5) and CAF at (-0.5, 1.5) of the demo plane.
  await pinTyped(page, 0.5, 1.5);
  await pinTyped(page, -0.5, 1.5);
  const compare = page.getByTestId('pin-compare');
  await expect(page.getByTestId('compare-phase-2')).toHaveText('CAF', {
    timeout: BUSY_MACHINE_MS,
  });
  expect(await typesetText(compare), 'pins side by side').not.toMatch(OTHER_SPELLINGS);
  // The canting angle's row names theta_c typeset: θ with the subscript c.
  const canting = compare.locator('tr[data-row="canting"] th');
  await expect(canting).toContainText('canting angle θc (°)');
  await expect(canting.locator('sub')).toHaveText('c');
  expect(await typesetText(page.getByTestId('probe')), 'Probe').not.toMatch(OTHER_SPELLINGS);

  // The Observations panel heads its columns B⊥ (T) and Δ_V (meV), typeset.
  const panel = page.getByTestId('observations');
  await panel.scrollIntoViewIfNeeded();
  await panel
    .getByTestId('observations-text')
    .fill(['bPerp_T,tilt_deg,valleyZeeman_meV,kind,value,sigma', '3,0,,phase,CAF,'].join('\n'));
  await panel.getByTestId('observations-keep').click();
  await expect(panel.getByTestId('observations-message')).toHaveText('1 row kept.');
  const heads = panel.getByTestId('observations-table').locator('thead th');
  await expect(heads.nth(1)).toHaveText('B⊥ (T)');
  await expect(heads.nth(1).locator('var')).toHaveText('B');
  await expect(heads.nth(1).locator('sub')).toHaveText('⊥');
  await expect(heads.nth(3)).toHaveText('ΔV (meV)');
  await expect(heads.nth(3).locator('sub')).toHaveText('V');

  // Fitted on the Map's workers: the parameters are the plane's axes, typeset (u⊥ per tesla).
  await panel.getByTestId('observations-fit').click();
  await expect(panel.getByTestId('observations-fit-status')).toHaveAttribute('data-phase', 'done', {
    timeout: BUSY_MACHINE_MS,
  });
  const parameter = panel.getByTestId('fit-parameter-0').locator('td').first();
  await expect(parameter).toHaveText('u⊥ (meV/T)');
  await expect(parameter.locator('sub')).toHaveText('⊥');
  expect(await typesetText(panel), 'Observations').not.toMatch(OTHER_SPELLINGS);

  // The selected pin's collective modes: axis titles, rotation names, E_X and l_B typeset.
  const dispersion = page.getByTestId('dispersion');
  await dispersion.locator('summary').click();
  await page.getByTestId('dispersion-coulomb').fill('4');
  await page.getByTestId('dispersion-coulomb').press('Enter');
  await expect(page.getByTestId('dispersion-chart')).toBeVisible({ timeout: BUSY_MACHINE_MS });
  expect(await typesetText(dispersion), 'collective modes').not.toMatch(
    new RegExp(`${OTHER_SPELLINGS.source}|l_B|sigma|tau|omega`),
  );
  await expect(dispersion.getByTestId('dispersion-legend').locator('li sub').first()).toHaveText(
    'z',
  );
  await expect(dispersion.locator('.dispersion-title tspan[font-style="italic"]')).toHaveText([
    'l',
  ]);
});
