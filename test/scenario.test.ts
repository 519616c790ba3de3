import { describe, expect, test } from 'vitest';
import { INTERFACES_EXAMPLE, errorOf, standardPlane } from './fixtures';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  SOFTWARE_VERSION,
  parseFitPlane,
  parseMapInput,
  parseObservationsCsv,
} from '../solver/index';
import { DEMO_SETUP } from '../app/scenario/demo';
import { scenarioToSetup, setupToScenario } from '../app/scenario/scenario';
import {
  SCENARIO_FILE_NAME,
  parseScenarioFile,
  scenarioFileText,
} from '../app/scenario/scenarioFile';
import { zeroChannels, type Setup } from '../app/scenario/setup';
import { APP_MAX_RESOLUTION, checkSetup, fitSetupToApp } from '../app/scenario/setupCheck';
import {
  decodeBase64Url,
  encodeBase64Url,
  readScenarioHash,
  readScenarioLink,
  scenarioHash,
} from '../app/scenario/urlState';
import { pinsOfScenarioText } from '../app/scenario/scenarioPins';

/** An invented generic model: several channels with H != F, a channel axis and a field axis. */
const GENERIC_SETUP: Setup = {
  filling: -1,
  channels: {
    ...zeroChannels(),
    x0: { hartree: -0.8, fock: -1 },
    y0: { hartree: -0.8, fock: -1 },
    z0: { hartree: 1.4, fock: 2 },
    xz: { hartree: 0.3, fock: -0.25 },
    zz: { hartree: -0.5, fock: 0.1 },
    '0x': { hartree: 0.2, fock: 0 },
  },
  zeeman: 0.3,
  valleyZeeman: -0.2,
  ratios: { uPerp: 0.8, uZ: 0.7 },
  x: { quantity: 'xz', from: -1, to: 1.5, hartreeRatio: 0.5 },
  y: { quantity: 'zeeman', from: 0, to: 2, hartreeRatio: 1 },
  resolution: [40, 30],
};

/** Two axes that are none of the app's own quantities (as a hand-written file might hold). */
const CUSTOM_SETUP: Setup = {
  ...GENERIC_SETUP,
  filling: 1,
  x: {
    quantity: 'custom',
    from: 0,
    to: 1,
    hartreeRatio: 1,
    label: 'tilt mix Δ_V − E_Z',
    targets: { zeeman: 1, 'zz.fock': 0.5 },
  },
  y: {
    quantity: 'custom',
    from: -1,
    to: 1,
    hartreeRatio: 1,
    label: 'u_x0 - u_y0',
    targets: { 'x0.fock': 1, 'y0.fock': -1 },
  },
};

/** A one-line message that starts with `prefix` (the field it names) and mentions `words`. */
function expectOneLine(message: string, prefix: string, words: string[] = []): void {
  expect(message).not.toContain('\n');
  expect(message.startsWith(prefix), `"${message}" should start with "${prefix}"`).toBe(true);
  for (const word of words) expect(message).toContain(word);
}

function withPlane(plane: Record<string, unknown>, extra: Record<string, unknown> = {}) {
  return { ...INTERFACES_EXAMPLE, ...extra, plane: { ...standardPlane(32, 32), ...plane } };
}

describe('setup <-> scenario document', () => {
  test('the demo survives the round trip, with its Hartree ratios in the axis targets', () => {
    const scenario = setupToScenario(DEMO_SETUP);
    expect(scenario.plane).toEqual({
      x: {
        label: 'u_perp',
        from: -2,
        to: 2,
        targets: { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': 1.2, 'y0.hartree': 1.2 },
      },
      y: { label: 'u_z', from: -2, to: 2, targets: { 'z0.fock': 1, 'z0.hartree': 0.7 } },
      resolution: [256, 256],
    });
    expect(scenario.channels).toEqual({});
    expect(scenarioToSetup(scenario)).toEqual(DEMO_SETUP);
  });

  test('a generic setup (H != F, a channel axis, a field axis) survives the round trip', () => {
    const scenario = setupToScenario(GENERIC_SETUP);
    expect(scenario.filling).toBe(-1);
    expect(Object.keys(scenario.channels as object).sort()).toEqual(
      ['0x', 'x0', 'xz', 'y0', 'z0', 'zz'].sort(),
    );
    const plane = scenario.plane as { x: unknown; y: unknown };
    expect(plane.x).toEqual({
      label: 'u_xz',
      from: -1,
      to: 1.5,
      targets: { 'xz.fock': 1, 'xz.hartree': 0.5 },
    });
    expect(plane.y).toEqual({ label: 'E_Z', from: 0, to: 2, targets: { zeeman: 1 } });
    expect(scenarioToSetup(scenario)).toEqual(GENERIC_SETUP);
  });

  test('custom axes keep their label and targets', () => {
    const back = scenarioToSetup(setupToScenario(CUSTOM_SETUP));
    expect(back).toEqual(CUSTOM_SETUP);
    expect(back.x.targets).toEqual({ zeeman: 1, 'zz.fock': 0.5 });
    expect(back.y.label).toBe('u_x0 - u_y0');
  });

  test('the standard plane of a model file is recognised as u_perp and u_z axes with ratio 1', () => {
    const setup = scenarioToSetup({ ...INTERFACES_EXAMPLE, plane: standardPlane(256, 256) });
    expect(setup.x.quantity).toBe('uPerp');
    expect(setup.y.quantity).toBe('uZ');
    expect(setup.ratios).toEqual({ uPerp: 1, uZ: 1 });
    expect(setup.channels.z0).toEqual({ hartree: 2, fock: 2 });
    expect(setup.zeeman).toBe(0.4);
    expect(setup.resolution).toEqual([256, 256]);
    // And it is written back as the same plane.
    expect(setupToScenario(setup).plane).toEqual(standardPlane(256, 256));
  });
});

describe('scenario in the URL hash', () => {
  test('base64url follows RFC 4648 section 5 (no padding, - and _ for + and /)', () => {
    expect(encodeBase64Url('foobar')).toBe('Zm9vYmFy');
    expect(encodeBase64Url('fooba')).toBe('Zm9vYmE');
    expect(encodeBase64Url('?>>')).toBe('Pz4-');
    expect(encodeBase64Url('???')).toBe('Pz8_');
    expect(decodeBase64Url('Pz8_', 'f')).toBe('???');
    expect(decodeBase64Url(encodeBase64Url('Δ_V ⊥ ν'), 'f')).toBe('Δ_V ⊥ ν');
  });

  test('encode then decode gives the same setup, and other hash parameters stay', () => {
    for (const setup of [DEMO_SETUP, GENERIC_SETUP, CUSTOM_SETUP]) {
      const hash = scenarioHash(setup);
      expect(hash).toMatch(/^#s=[A-Za-z0-9_-]+$/);
      expect(readScenarioHash(hash)).toEqual(setup);
    }
    const hash = scenarioHash(GENERIC_SETUP, '#probe=0.5,1');
    const params = new URLSearchParams(hash.slice(1));
    expect(params.get('probe')).toBe('0.5,1');
    expect(readScenarioHash(hash)).toEqual(GENERIC_SETUP);
    // A hash is compact JSON: the demo fits in well under a kilobyte.
    expect(scenarioHash(DEMO_SETUP).length).toBeLessThan(600);
  });

  test('a hash without a scenario gives null', () => {
    expect(readScenarioHash('')).toBeNull();
    expect(readScenarioHash('#')).toBeNull();
    expect(readScenarioHash('#probe=1,2')).toBeNull();
  });

  test('bad base64, bad JSON and bad scenarios give one line naming the problem', () => {
    expectOneLine(
      errorOf(() => readScenarioHash('#s=ab$cd')),
      'link (#s=):',
      ['base64url'],
    );
    expectOneLine(
      errorOf(() => readScenarioHash('#s=abcde')),
      'link (#s=):',
      ['base64url'],
    );
    expectOneLine(
      errorOf(() => readScenarioHash('#s=')),
      'link (#s=):',
      ['empty'],
    );
    const cut = `#s=${encodeBase64Url('{"filling": 0, "channels": ')}`;
    expectOneLine(
      errorOf(() => readScenarioHash(cut)),
      'link (#s=):',
      ['not valid JSON'],
    );
    const unknown = `#s=${encodeBase64Url(JSON.stringify(withPlane({}, { channels: { q9: 1 } })))}`;
    expectOneLine(
      errorOf(() => readScenarioHash(unknown)),
      'link (#s=): channels.q9:',
      ['unknown channel'],
    );
    const noPlane = `#s=${encodeBase64Url(JSON.stringify(INTERFACES_EXAMPLE))}`;
    expectOneLine(
      errorOf(() => readScenarioHash(noPlane)),
      'link (#s=): plane:',
    );
  });
});

describe('scenario file', () => {
  test('is the pretty-printed model-plus-plane document with the software version', () => {
    const text = scenarioFileText(GENERIC_SETUP);
    expect(text.endsWith('}\n')).toBe(true);
    expect(text).toContain('\n  "filling": -1,\n');
    const json = JSON.parse(text) as Record<string, unknown>;
    expect(json.fourfold).toEqual({ version: SOFTWARE_VERSION });
    // What `npm run map -- --model FILE` reads: the solver accepts it as it stands.
    const input = parseMapInput(json);
    expect(input.model.channels.xz).toEqual({ hartree: 0.3, fock: -0.25 });
    expect(input.plane.resolution).toEqual([40, 30]);
    expect(parseScenarioFile(text, SCENARIO_FILE_NAME)).toEqual(GENERIC_SETUP);
  });

  test('bad files give one line that starts with the file name and names the field', () => {
    const name = SCENARIO_FILE_NAME;
    expectOneLine(
      errorOf(() => parseScenarioFile('{ "filling": 0, ', name)),
      `${name}:`,
      ['not valid JSON'],
    );
    const file = (json: unknown) => () => parseScenarioFile(JSON.stringify(json), name);
    expectOneLine(errorOf(file(withPlane({}, { channels: { q9: 1 } }))), `${name}: channels.q9:`, [
      'unknown channel',
    ]);
    const flat = { ...standardPlane(32, 32).x, from: 1, to: 1 };
    expectOneLine(errorOf(file(withPlane({ x: flat }))), `${name}: plane.x.to:`, [
      'must differ from plane.x.from',
    ]);
    expectOneLine(
      errorOf(file(withPlane({ resolution: [9000, 64] }))),
      `${name}: plane.resolution[0]:`,
      ['9000', '8192'],
    );
    expectOneLine(errorOf(file(withPlane({}, { zeeman: 'NaN' }))), `${name}: zeeman:`, [
      'finite number',
      '"NaN"',
    ]);
    expectOneLine(errorOf(file([1, 2])), `${name}: scenario:`);
  });
});

describe('app limits', () => {
  test('checkSetup accepts the demo and names the field of a setup it refuses', () => {
    expect(checkSetup(DEMO_SETUP)).toBeNull();
    expect(checkSetup(GENERIC_SETUP)).toBeNull();
    const flat = { ...DEMO_SETUP, y: { ...DEMO_SETUP.y, from: 2 } };
    expect(checkSetup(flat)).toBe('plane.y.to: must differ from plane.y.from');
    const big = { ...DEMO_SETUP, resolution: [256, 1500] as const };
    const message = checkSetup(big)!;
    expectOneLine(message, 'plane.resolution[1]:', [
      `at most ${APP_MAX_RESOLUTION}`,
      'npm run map',
    ]);
    const nan = { ...DEMO_SETUP, valleyZeeman: Number.NaN };
    expectOneLine(checkSetup(nan)!, 'valleyZeeman:', ['finite number']);
  });

  test('a loaded grid beyond the browser limit is reduced, and says so', () => {
    const loaded = { ...GENERIC_SETUP, resolution: [2048, 300] as const };
    const fitted = fitSetupToApp(loaded);
    expect(fitted.setup.resolution).toEqual([APP_MAX_RESOLUTION, 300]);
    expect(fitted.setup.channels).toBe(loaded.channels);
    expect(fitted.note).toContain('2048 × 300');
    expect(fitSetupToApp(GENERIC_SETUP)).toEqual({ setup: GENERIC_SETUP, note: null });
  });
});

describe('Probe pins in the scenario file and the link', () => {
  const pins = [
    { id: 3, x: -0.7, y: 0.9 },
    { id: 5, x: 1.25, y: -1.5 },
  ];

  test('they ride in fourfold.pins, in order, and come back numbered from 1', () => {
    const text = scenarioFileText(DEMO_SETUP, pins);
    expect(JSON.parse(text).fourfold.pins).toEqual([
      [-0.7, 0.9],
      [1.25, -1.5],
    ]);
    expect(pinsOfScenarioText(text, 'f.json')).toEqual([
      { id: 1, x: -0.7, y: 0.9 },
      { id: 2, x: 1.25, y: -1.5 },
    ]);
    // The setup is the same with or without pins, and the model the workers solve has none.
    expect(parseScenarioFile(text, 'f.json')).toEqual(
      parseScenarioFile(scenarioFileText(DEMO_SETUP), 'f.json'),
    );
    expect(JSON.stringify(setupToScenario(DEMO_SETUP))).not.toContain('pins');
    expect(pinsOfScenarioText(scenarioFileText(DEMO_SETUP), 'f.json')).toBeNull();

    const link = readScenarioLink(scenarioHash(DEMO_SETUP, '#view=1', pins))!;
    expect(link.pins!.map((p) => [p.x, p.y])).toEqual([
      [-0.7, 0.9],
      [1.25, -1.5],
    ]);
    expect(link.setup).toEqual(readScenarioHash(scenarioHash(DEMO_SETUP))!);
  });

  test('malformed pins give one line naming the entry', () => {
    const document = (value: unknown) =>
      JSON.stringify({ ...setupToScenario(DEMO_SETUP), fourfold: { pins: value } });
    expect(errorOf(() => pinsOfScenarioText(document('here'), 'f.json'))).toBe(
      'f.json: fourfold.pins: expected a list of [x, y] points',
    );
    expect(errorOf(() => pinsOfScenarioText(document([[0, 1], [2]]), 'f.json'))).toBe(
      'f.json: fourfold.pins[1]: expected [x, y] with two finite numbers',
    );
    expect(errorOf(() => pinsOfScenarioText(document([[0, 'NaN']]), 'link'))).toMatch(
      /^link: fourfold\.pins\[0\]/,
    );
    expect(
      errorOf(() => pinsOfScenarioText(document(Array.from({ length: 99 }, () => [0, 0])), 'f')),
    ).toMatch(/at most/);
  });
});

describe('observations in the scenario file, the link and the autosave', () => {
  const document = {
    ...setupToScenario(GENERIC_SETUP),
    fourfold: {
      observations: {
        rows: [
          {
            bPerp_T: 6,
            tilt_deg: 0,
            valleyZeeman_meV: null,
            kind: 'phase',
            value: 'no spin moment',
            sigma: null,
          },
          {
            bPerp_T: 9,
            tilt_deg: null,
            valleyZeeman_meV: 0.5,
            kind: 'transition_tilt',
            value: 49.4,
            sigma: 1,
            pair: 'KD/CAF',
          },
          { bPerp_T: 6, tilt_deg: 0, valleyZeeman_meV: null, kind: 'gap', value: 0.8, sigma: 0.15 },
        ],
        fitGaps: true,
        freeRatio: null,
      },
    },
  };

  test('they ride in fourfold.observations and come back as loaded', () => {
    const setup = scenarioToSetup(document);
    expect(setup.observations?.rows).toHaveLength(3);
    expect(setup.observations?.rows[1]).toEqual({
      bPerpTesla: 9,
      tiltDeg: null,
      valleyZeemanMeV: 0.5,
      kind: 'transition_tilt',
      value: 49.4,
      sigma: 1,
      pair: ['KD', 'CAF'],
    });
    expect(setup.observations?.options).toEqual({ fitGaps: true, freeRatio: null });
    expect(setupToScenario(setup).fourfold).toEqual(document.fourfold);
    expect(readScenarioHash(scenarioHash(setup))).toEqual(setup);
    expect(parseScenarioFile(scenarioFileText(setup), SCENARIO_FILE_NAME)).toEqual(setup);
    // Without observations the document has no such block.
    expect(setupToScenario(GENERIC_SETUP).fourfold).toBeUndefined();
  });

  test('a bad row gives one line naming the row and the column', () => {
    const rows: Record<string, unknown>[] = [...document.fourfold.observations.rows];
    rows[1] = { ...rows[1]!, sigma: -1 };
    const message = errorOf(() =>
      scenarioToSetup({
        ...document,
        fourfold: { observations: { ...document.fourfold.observations, rows } },
      }),
    );
    expect(message).toBe(
      'scenario: fourfold.observations.rows row 2, column sigma: expected a positive uncertainty, got -1',
    );
  });

  test('the invented example loads in the app with the rows of its CSV and the plane of the fit', () => {
    const example = (name: string) => readFileSync(join('public', 'examples', name), 'utf8');
    const scenario = JSON.parse(example('invented-fit-scenario.json'));
    const setup = scenarioToSetup(scenario);
    expect(setup.observations?.rows).toEqual(
      parseObservationsCsv(example('invented-fit-observations.csv')),
    );
    expect(setup.name).toContain('Invented');
    expect(parseFitPlane(scenario).document).toEqual(
      parseFitPlane(JSON.parse(example('invented-fit-plane.json'))).document,
    );
  });
});
