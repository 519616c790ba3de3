import { readFileSync } from 'node:fs';
import { expect, test, type Download, type Page } from '@playwright/test';
import { parseCsvStrictly, parseXmlStrictly, textsOf } from '../test/strictParsers';
import { BUSY_MACHINE_MS, failOnConsoleErrors, mapDone, typeCutLine } from './demoPage';

failOnConsoleErrors();

// Every file the app writes, from a scenario whose axis names are hostile text of our own: a
// leading '=' (a spreadsheet formula), control characters XML 1.0 does not allow, quotes,
// commas, a newline and a lone CR, markup. Each file is read back by a real parser: the SVGs by
// @xmldom/xmldom (failing on any warning) and by Chromium's own XML parser, the CSVs by
// csv-parse, the JSON by JSON.parse.
const HOSTILE_X = '=HYPERLINK("x",1)\u0001 "quoted", a\nb\rc\ud800\ufffe <&>';
const HOSTILE_Y = '-u_z,\u000b@y';
const HOSTILE_TITLE = '=E_Z "title",\u0002 <b>&amp;';

/** A link to the scenario: custom axes (targets none of the app's quantities) with those names. */
function hostileLink(): string {
  const scenario = {
    filling: 0,
    channels: {},
    zeeman: 0.6,
    valleyZeeman: 0,
    plane: {
      x: {
        label: HOSTILE_X,
        from: -2,
        to: 2,
        targets: { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': 1.2, 'y0.hartree': 1.1 },
      },
      y: {
        label: HOSTILE_Y,
        from: -2,
        to: 2,
        targets: { 'z0.fock': 1, 'z0.hartree': 0.7, 'zz.fock': 0.05 },
      },
      resolution: [40, 40],
    },
  };
  return `/#s=${Buffer.from(JSON.stringify(scenario)).toString('base64url')}`;
}

/**
 * A text cell as the CSV holds it: after a leading apostrophe, since it starts like a formula,
 * and in UTF-8, where the lone surrogate can only be U+FFFD.
 */
const neutralised = (text: string) =>
  new TextDecoder().decode(new TextEncoder().encode(`'${text}`));

async function openHostile(page: Page): Promise<void> {
  await page.goto(hostileLink());
  await mapDone(page);
}

/** Clicks `testId` and returns the downloaded file's name and bytes. */
async function download(page: Page, testId: string, timeout = BUSY_MACHINE_MS) {
  const [file] = await Promise.all([
    page.waitForEvent('download', { timeout }) as Promise<Download>,
    page.getByTestId(testId).click(),
  ]);
  return { name: file.suggestedFilename(), bytes: readFileSync((await file.path())!) };
}

/** Parses the SVG strictly here and with Chromium's XML parser; returns the text contents. */
async function readSvg(page: Page, bytes: Buffer): Promise<string[]> {
  const text = bytes.toString('utf8');
  const doc = parseXmlStrictly(text);
  const browserErrors = await page.evaluate(
    (svg) =>
      new DOMParser().parseFromString(svg, 'image/svg+xml').getElementsByTagName('parsererror')
        .length,
    text,
  );
  expect(browserErrors).toBe(0);
  return [...textsOf(doc), ...textsOf(doc, 'title'), ...textsOf(doc, 'desc')];
}

test('Map exports (SVG, PNG, CSV, JSON) of a scenario with hostile axis names and title', async ({
  page,
}) => {
  await openHostile(page);
  await page.getByTestId('figure-title').fill(HOSTILE_TITLE);

  const svg = await download(page, 'export-svg');
  expect(svg.name).toBe('fourfold-map.svg');
  const texts = (await readSvg(page, svg.bytes)).join('\n');
  expect(texts).toContain('"title",\u2402 <b>&amp;');
  expect(texts).toContain('=HYPERLINK("x",1)\u2401 "quoted", a');

  const png = await download(page, 'export-png');
  expect(png.name).toBe('fourfold-map.png');
  // The PNG signature, then the IHDR chunk with a nonzero width (PNG specification, ISO/IEC
  // 15948; its sections 5.2 and 11.2.2 from memory).
  expect([...png.bytes.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
  expect(png.bytes.subarray(12, 16).toString('latin1')).toBe('IHDR');
  expect(png.bytes.readUInt32BE(16)).toBeGreaterThan(0);

  const csv = await download(page, 'export-csv', 2 * BUSY_MACHINE_MS);
  const { header, rows, comments } = parseCsvStrictly(csv.bytes.toString('utf8'));
  // The caution, the version and model, and the plane (its hostile axis names inside JSON, on
  // one line).
  expect(comments).toHaveLength(3);
  expect(comments[2]).toMatch(/^# plane \{"x":\{"label":/);
  expect(header.slice(0, 3)).toEqual([neutralised(HOSTILE_X), neutralised(HOSTILE_Y), 'phase']);
  expect(rows).toHaveLength(40 * 40);
  for (const row of rows) {
    // Numbers stay numbers (negative ones too); the label is a label.
    if (row.length !== 20 || ![0, 1, 3, 4].every((k) => Number.isFinite(Number(row[k])))) {
      throw new Error(`bad row: ${row.join('|')}`);
    }
  }
  expect(rows.some((row) => row[3]!.startsWith('-'))).toBe(true);

  const json = await download(page, 'export-json', 2 * BUSY_MACHINE_MS);
  const doc = JSON.parse(json.bytes.toString('utf8')) as {
    plane: { x: { label: string }; y: { label: string } };
    phase: string[][];
  };
  expect(doc.plane.x.label).toBe(HOSTILE_X);
  expect(doc.plane.y.label).toBe(HOSTILE_Y);
  expect(doc.phase).toHaveLength(40);
});

test('Cut exports (SVG, CSV, JSON) of a scenario with hostile axis names', async ({ page }) => {
  await openHostile(page);
  const cut = page.getByTestId('cut');
  await typeCutLine(page, ['-1.8', '1.5'], ['1.5', '-1.8']);
  // Done with the line typed last (not one of the partial lines before it).
  const status = cut.getByTestId('cut-status');
  await expect(status).toHaveAttribute('data-path', 'line:-1.8,1.5:1.5,-1.8', {
    timeout: BUSY_MACHINE_MS,
  });
  await expect(status).toHaveAttribute('data-status', 'done', { timeout: BUSY_MACHINE_MS });
  await expect(cut.getByTestId('cut-transition').first()).toBeVisible();
  const transitions = await cut.getByTestId('cut-transition').count();

  const svg = await download(page, 'cut-export-svg');
  expect(svg.name).toBe('fourfold-cut.svg');
  expect((await readSvg(page, svg.bytes)).join('\n')).toContain('=HYPERLINK("x",1)\u2401');

  const csv = await download(page, 'cut-export-csv');
  const { header, rows, comments } = parseCsvStrictly(csv.bytes.toString('utf8'));
  // Caution, model, path, then one line per transition: a newline in a name splits none.
  expect(comments).toHaveLength(3 + transitions);
  // The horizontal quantity of a line on which both coordinates change is its distance.
  expect(header.slice(0, 5)).toEqual([
    't',
    'distance',
    neutralised(HOSTILE_X),
    neutralised(HOSTILE_Y),
    'phase',
  ]);
  expect(rows.length).toBeGreaterThan(1);
  expect(rows.every((row) => row.length === header.length)).toBe(true);

  const json = await download(page, 'cut-export-json');
  const doc = JSON.parse(json.bytes.toString('utf8')) as {
    plane: { x: { label: string } };
    transitions: unknown[];
  };
  expect(doc.plane.x.label).toBe(HOSTILE_X);
  expect(doc.transitions).toHaveLength(transitions);
});

test('Probe exports (JSON, lattice SVG) of a pin in that scenario', async ({ page }) => {
  await openHostile(page);
  const box = (await page.getByTestId('map-plot').boundingBox())!;
  await page.mouse.click(box.x + 0.3 * box.width, box.y + 0.3 * box.height);
  await expect(page.getByTestId('probe-details')).toHaveAttribute('data-phase', /.+/, {
    timeout: BUSY_MACHINE_MS,
  });
  const phase = (await page.getByTestId('probe-details').getAttribute('data-phase'))!;

  const json = await download(page, 'probe-export-json');
  const report = JSON.parse(json.bytes.toString('utf8')) as { state: { phase: string } };
  expect(report.state.phase).toBe(phase);

  const lattice = await download(page, 'probe-export-lattice');
  expect(lattice.name).toMatch(/\.svg$/);
  expect((await readSvg(page, lattice.bytes)).join('\n')).toContain(phase);
});
