import { describe, expect, test } from 'vitest';
import {
  CHANNELS,
  ModelError,
  parseMapInput,
  seededRandom,
  type RandomSource,
} from '../solver/index';
import { errorOf } from './fixtures';
import { FOCK_ONLY_SCENARIO } from './scenarios';
import { toPhysicalUnits } from '../app/scenario/physical';
import { scenarioToSetup, setupToMapInput, setupToScenario } from '../app/scenario/scenario';
import { parseScenarioFile, readScenario, scenarioFileText } from '../app/scenario/scenarioFile';
import { APP_MAX_RESOLUTION } from '../app/scenario/setupCheck';
import { readScenarioLink, scenarioHash } from '../app/scenario/urlState';

/** One of the items, drawn uniformly. */
function pick<T>(random: RandomSource, items: readonly T[]): T {
  return items[Math.floor(random() * items.length)]!;
}

/** A coupling-sized number: often a short decimal, sometimes any double, sometimes zero. */
function value(random: RandomSource): number {
  const r = random();
  if (r < 0.1) return 0;
  // (+ 0 turns a -0, which JSON writes as 0, into 0.)
  if (r < 0.5) return Math.round((4 * random() - 2) * 100) / 100 + 0;
  return 4 * random() - 2;
}

const LABELS = ['u_perp', 'u_z', 'E_Z', 'Delta_V', 'u_xz', 'mix Δ_V − E_Z', '', 'u⊥ (meV)'];

/**
 * Axis targets with the label that our own quantity would write: our quantities (exactly or
 * nearly), one-part targets, or anything.
 */
function randomTargets(random: RandomSource): [Record<string, number>, string] {
  const r = random();
  const ratio = random() < 0.5 ? pick(random, [0, 0.5, 0.8, 1, 1.2]) : value(random);
  if (r < 0.15)
    return [{ 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': ratio, 'y0.hartree': ratio }, 'u_perp'];
  if (r < 0.25) return [{ 'x0.fock': 1, 'y0.fock': 1 }, 'u_perp'];
  if (r < 0.35) return [{ 'z0.fock': 1, 'z0.hartree': ratio }, 'u_z'];
  if (r < 0.42) return [{ 'z0.fock': 1 }, 'u_z'];
  if (r < 0.5) {
    const field = pick(random, ['zeeman', 'valleyZeeman']);
    return [{ [field]: pick(random, [1, 1, 0.5]) }, field === 'zeeman' ? 'E_Z' : 'Delta_V'];
  }
  if (r < 0.6) {
    const ch = pick(random, CHANNELS);
    const targets =
      random() < 0.5
        ? { [`${ch}.fock`]: 1, [`${ch}.hartree`]: ratio }
        : { [`${ch}.fock`]: pick(random, [1, value(random)]) };
    return [targets, `u_${ch}`];
  }
  const out: Record<string, number> = {};
  const count = 1 + Math.floor(random() * 4);
  for (let k = 0; k < count; k++) {
    const name =
      random() < 0.15
        ? pick(random, ['zeeman', 'valleyZeeman'])
        : `${pick(random, CHANNELS)}.${random() < 0.75 ? 'fock' : 'hartree'}`;
    out[name] = value(random) || 1;
  }
  return [out, 'mix'];
}

function randomAxis(random: RandomSource) {
  const from = value(random);
  let to = value(random);
  if (to === from) to = from + 1;
  const [targets, label] = randomTargets(random);
  return { label: random() < 0.8 ? label : pick(random, LABELS), from, to, targets };
}

/** A model file with a plane as `npm run map` accepts it: anything the format allows. */
function randomScenario(random: RandomSource): Record<string, unknown> {
  const channels: Record<string, unknown> = {};
  for (const ch of CHANNELS) {
    const r = random();
    if (r < 0.45) continue;
    if (r < 0.55) channels[ch] = value(random);
    else if (r < 0.7) channels[ch] = { fock: value(random) };
    else if (r < 0.75) channels[ch] = { hartree: 0, fock: 0 };
    else channels[ch] = { hartree: value(random), fock: value(random) };
  }
  const json: Record<string, unknown> = {
    filling: pick(random, [-1, 0, 1]),
    channels,
    plane: {
      x: randomAxis(random),
      y: randomAxis(random),
      resolution:
        random() < 0.3
          ? 2 + Math.floor(random() * 300)
          : [2 + Math.floor(random() * 510), 2 + Math.floor(random() * 510)],
    },
  };
  if (random() < 0.8) json.zeeman = Math.abs(value(random));
  if (random() < 0.6) json.valleyZeeman = value(random);
  if (random() < 0.3) {
    const oneBody: Record<string, number> = {};
    for (let k = 0; k < 3; k++) oneBody[pick(random, CHANNELS)] = value(random);
    json.oneBody = oneBody;
  }
  if (random() < 0.3) json.exchange = Math.abs(value(random));
  if (random() < 0.2) json.name = 'an invented sample';
  if (random() < 0.1) json.description = 'hand-written, for the round trip';
  return json;
}

describe('every scenario the command line maps loads into the app unchanged', () => {
  test('save after load gives the same model and plane (300 seeded random files)', () => {
    const random = seededRandom(12);
    let loaded = 0;
    let custom = 0;
    let named = 0;
    for (let trial = 0; trial < 300; trial++) {
      const json = randomScenario(random);
      let cli;
      try {
        cli = parseMapInput(json);
      } catch (error) {
        // The command line refuses these too (a Hartree target with no Fock part).
        expect(error).toBeInstanceOf(ModelError);
        expect((error as Error).message).toMatch(/Hartree part alone/);
        continue;
      }
      const setup = scenarioToSetup(json);
      // The model and plane the app maps and saves are those of the file, number for number.
      expect(setupToMapInput(setup)).toEqual(cli);
      const text = scenarioFileText(setup);
      expect(parseMapInput(JSON.parse(text))).toEqual(cli);
      expect(JSON.parse(text).name).toBe(json.name);
      // The file, the link and the autosave read back the same setup.
      expect(parseScenarioFile(text, 'f.json')).toEqual(setup);
      expect(readScenarioLink(scenarioHash(setup))!.setup).toEqual(setup);
      expect(readScenario(setupToScenario(setup), 'autosave').setup).toEqual(setup);
      loaded++;
      for (const axis of [setup.x, setup.y]) {
        if (axis.quantity === 'custom') custom++;
        else named++;
      }
    }
    expect(loaded).toBeGreaterThanOrEqual(200);
    // Both ways of holding an axis are exercised.
    expect(custom).toBeGreaterThan(100);
    expect(named).toBeGreaterThan(100);
  });

  test('in physical units too (60 random files switched to physical units)', () => {
    const random = seededRandom(34);
    let checked = 0;
    while (checked < 60) {
      const json = randomScenario(random);
      try {
        parseMapInput(json);
      } catch {
        continue;
      }
      const physical = toPhysicalUnits(scenarioToSetup(json));
      const text = scenarioFileText(physical);
      const back = parseScenarioFile(text, 'f.json');
      expect(back).toEqual(physical);
      expect(setupToMapInput(back)).toEqual(parseMapInput(JSON.parse(text)));
      checked++;
    }
  });

  test("the README's Fock-only plane keeps x0's and z0's Hartree parts", () => {
    const file = FOCK_ONLY_SCENARIO;
    const setup = scenarioToSetup(file);
    expect(setup.x.quantity).toBe('custom');
    expect(setup.y.quantity).toBe('custom');
    expect(setup.channels.x0).toEqual({ hartree: -0.8, fock: -1 });
    expect(setupToScenario(setup).plane).toEqual(file.plane);
    expect(setupToMapInput(setup)).toEqual(parseMapInput(file));
  });

  test('a listed zero channel stays listed, so a one-part axis keeps its other part at zero', () => {
    const file = {
      filling: 0,
      channels: { zz: { hartree: 0, fock: 0 } },
      plane: {
        x: { label: 'u_zz', from: -1, to: 1, targets: { 'zz.fock': 1 } },
        y: { label: 'E_Z', from: 0, to: 1, targets: { zeeman: 1 } },
        resolution: [16, 16],
      },
    };
    const setup = scenarioToSetup(file);
    expect(setup.listedZero).toEqual(['zz']);
    expect(setupToScenario(setup).channels).toEqual({ zz: { hartree: 0, fock: 0 } });
  });

  test('a grid beyond the browser is the one change, and it is said', () => {
    const json = {
      filling: 0,
      channels: { x0: -1 },
      plane: {
        x: { label: 'E_Z', from: 0, to: 1, targets: { zeeman: 1 } },
        y: { label: 'Delta_V', from: 0, to: 1, targets: { valleyZeeman: 1 } },
        resolution: [2048, 300],
      },
    };
    const read = readScenario(json, 'autosave');
    expect(read.setup.resolution).toEqual([APP_MAX_RESOLUTION, 300]);
    expect(read.note).toContain('2048 × 300');
    // The command line's largest grid is cut the same way; a larger one is refused in one line
    // naming the source, the side, the value and the cap (from a file, the link or the autosave).
    const largest = { ...json, plane: { ...json.plane, resolution: [8192, 6] } };
    const cut = readScenario(largest, 'autosave');
    expect(cut.setup.resolution).toEqual([APP_MAX_RESOLUTION, 6]);
    expect(cut.note).toContain('8192 × 6 reduced to 512 × 6');
    const huge = { ...json, plane: { ...json.plane, resolution: [6, 8193] } };
    for (const source of ['autosave', 'big.json']) {
      expect(errorOf(() => readScenario(huge, source))).toBe(
        `${source}: plane.resolution[1]: expected an integer from 2 to 8192, got 8193`,
      );
    }
    const setup = scenarioToSetup(largest);
    expect(readScenarioLink(scenarioHash(setup))?.setup.resolution).toEqual([
      APP_MAX_RESOLUTION,
      6,
    ]);
    const hugeLink = scenarioHash({ ...setup, resolution: [6, 8193] });
    expect(errorOf(() => readScenarioLink(hugeLink))).toMatch(
      /^link \(#[^)]*\): plane\.resolution\[1\]: expected an integer from 2 to 8192, got 8193$/,
    );
  });

  test('a file the app cannot hold as it is is refused with one line naming the field', () => {
    // A range on x0 sets u_perp's Hartree/Fock ratio; an axis with another ratio cannot stay.
    const file = {
      filling: 0,
      channels: { x0: -1, y0: -1 },
      plane: {
        x: {
          label: 'u_perp',
          from: -2,
          to: 2,
          targets: { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': 0.3, 'y0.hartree': 0.3 },
        },
        y: { label: 'E_Z', from: 0, to: 1, targets: { zeeman: 1 } },
        resolution: [16, 16],
      },
      fourfold: { ranges: { x0: { profile: 'gaussian', strength: -1, range: 0 } } },
    };
    const message = errorOf(() => scenarioToSetup(file));
    expect(message).not.toContain('\n');
    expect(message).toMatch(/^plane\.x\.targets\.x0\.hartree: 0\.3 in the file, 1 here;/);
  });
});
