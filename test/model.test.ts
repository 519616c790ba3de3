import { describe, expect, test } from 'vitest';
import { INTERFACES_EXAMPLE, errorOf, standardPlane } from './fixtures';
import {
  CHANNELS,
  PlaneCouplings,
  axisValue,
  channelIndex,
  couplingsOf,
  parseMapInput,
  parseModel,
  parsePlane,
  seededRandom,
  type Channel,
  type Couplings,
  type RandomSource,
} from '../solver/index';

/** The standard (uPerp, uZ) plane of a model file, at a small resolution. */
const INTERFACES_PLANE = standardPlane(24, 16);

/** Asserts a one-line message that starts with (names) the field path. */
function expectFieldError(run: () => unknown, field: string, mentions: string[] = []): void {
  const message = errorOf(run);
  expect(message).not.toContain('\n');
  expect(message.startsWith(`${field}:`) || message.startsWith(`${field} `)).toBe(true);
  for (const word of mentions) expect(message).toContain(word);
}

function withChannels(channels: unknown): Record<string, unknown> {
  return { ...INTERFACES_EXAMPLE, channels };
}

describe('parseModel', () => {
  test('accepts the worked-point model file and returns a frozen plain-data model', () => {
    const model = parseModel(INTERFACES_EXAMPLE);
    expect(model.filling).toBe(0);
    expect(model.channels).toEqual({
      x0: { hartree: -1, fock: -1 },
      y0: { hartree: -1, fock: -1 },
      z0: { hartree: 2, fock: 2 },
    });
    expect(model.zeeman).toBe(0.4);
    expect(model.valleyZeeman).toBe(0);
    expect(model.oneBody).toEqual({});
    expect(model.exchange).toBeUndefined();
    expect(Object.isFrozen(model)).toBe(true);
    expect(Object.isFrozen(model.channels)).toBe(true);
    expect(Object.isFrozen(model.channels.x0)).toBe(true);
  });

  test('accepts all 15 channels, fillings -1, 0, 1, and defaults zeeman and valleyZeeman to 0', () => {
    const channels = Object.fromEntries(CHANNELS.map((name, k) => [name, { fock: k + 1 }]));
    for (const filling of [-1, 0, 1]) {
      const model = parseModel({ filling, channels });
      expect(model.filling).toBe(filling);
      expect(model.zeeman).toBe(0);
      expect(model.valleyZeeman).toBe(0);
      CHANNELS.forEach((name, k) => expect(model.channels[name]?.fock).toBe(k + 1));
    }
    expect(Object.keys(parseModel({ filling: 0 }).channels)).toEqual([]);
  });

  test('a channel without hartree has hartree equal to fock', () => {
    const model = parseModel(withChannels({ zx: { fock: -0.3 }, x0: { hartree: 0.5, fock: 2 } }));
    expect(model.channels.zx).toEqual({ hartree: -0.3, fock: -0.3 });
    expect(model.channels.x0).toEqual({ hartree: 0.5, fock: 2 });
  });

  test('a bare number for a channel means hartree = fock = that number', () => {
    const model = parseModel(withChannels({ x0: -1.25, zz: 0 }));
    expect(model.channels.x0).toEqual({ hartree: -1.25, fock: -1.25 });
    expect(model.channels.zz).toEqual({ hartree: 0, fock: 0 });
  });

  test('unknown channels "qq", "00", "x", "x0y" and "X0" are rejected, naming channels.<name>', () => {
    for (const name of ['qq', '00', 'x', 'x0y', 'X0']) {
      expectFieldError(() => parseModel(withChannels({ [name]: 1 })), `channels.${name}`, [
        'unknown channel',
      ]);
    }
    // 00 is the SU(4)-symmetric part (public/notes.html#energy), so its message says so.
    expect(errorOf(() => parseModel(withChannels({ '00': 1 })))).toContain('SU(4)');
  });

  test('hartree without fock is an error naming channels.x0.fock', () => {
    expectFieldError(() => parseModel(withChannels({ x0: { hartree: 1 } })), 'channels.x0.fock', [
      'hartree',
    ]);
  });

  test('an unknown field inside a channel is an error naming it', () => {
    expectFieldError(
      () => parseModel(withChannels({ x0: { fock: 1, direct: 1 } })),
      'channels.x0.direct',
    );
  });

  test('non-numbers are rejected with the field path: strings, null, booleans, arrays, objects', () => {
    for (const bad of ['1', 'NaN', null, true, [1], {}]) {
      expectFieldError(() => parseModel(withChannels({ x0: { fock: bad } })), 'channels.x0.fock', [
        'finite number',
      ]);
      expectFieldError(
        () => parseModel(withChannels({ x0: { hartree: bad, fock: 1 } })),
        'channels.x0.hartree',
      );
      expectFieldError(() => parseModel({ ...INTERFACES_EXAMPLE, zeeman: bad }), 'zeeman');
      expectFieldError(
        () => parseModel({ ...INTERFACES_EXAMPLE, valleyZeeman: bad }),
        'valleyZeeman',
      );
      expectFieldError(() => parseModel({ ...INTERFACES_EXAMPLE, exchange: bad }), 'exchange');
    }
    // A bare channel value that is not a number or an object.
    expectFieldError(() => parseModel(withChannels({ y0: 'strong' })), 'channels.y0');
  });

  test('NaN, Infinity and -Infinity (possible in an object, not in JSON) are rejected', () => {
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      expectFieldError(() => parseModel(withChannels({ x0: bad })), 'channels.x0', [String(bad)]);
      expectFieldError(() => parseModel(withChannels({ x0: { fock: bad } })), 'channels.x0.fock');
      expectFieldError(
        () => parseModel(withChannels({ z0: { fock: 1, hartree: bad } })),
        'channels.z0.hartree',
      );
      expectFieldError(() => parseModel({ ...INTERFACES_EXAMPLE, zeeman: bad }), 'zeeman', [
        String(bad),
      ]);
      expectFieldError(
        () => parseModel({ ...INTERFACES_EXAMPLE, valleyZeeman: bad }),
        'valleyZeeman',
      );
    }
  });

  test('filling 2, -2, 0.5, "0", null and a missing filling are rejected, naming filling', () => {
    for (const bad of [2, -2, 0.5, '0', null]) {
      expectFieldError(() => parseModel({ ...INTERFACES_EXAMPLE, filling: bad }), 'filling');
    }
    const { filling: _unused, ...withoutFilling } = INTERFACES_EXAMPLE;
    expect(_unused).toBe(0);
    expectFieldError(() => parseModel(withoutFilling), 'filling', ['missing']);
  });

  test('an unknown top-level field is rejected by name', () => {
    expectFieldError(() => parseModel({ ...INTERFACES_EXAMPLE, zeman: 0.4 }), 'zeman', [
      'unknown field',
    ]);
  });

  test('channels that are not an object (array, number, string, null) are rejected', () => {
    for (const bad of [[], 3, 'x0', null]) {
      expectFieldError(() => parseModel(withChannels(bad)), 'channels');
    }
  });

  test('a model that is not an object is rejected in one line', () => {
    for (const bad of [null, 3, 'model', [INTERFACES_EXAMPLE]]) {
      expectFieldError(() => parseModel(bad), 'model');
    }
  });

  test('the where prefix (used for arrays of models) leads every field path', () => {
    expectFieldError(() => parseModel(withChannels({ qq: 1 }), '[1]'), '[1].channels.qq');
    expectFieldError(() => parseModel({ ...INTERFACES_EXAMPLE, filling: 3 }, '[0]'), '[0].filling');
  });
});

const GOOD_MAP = { ...INTERFACES_EXAMPLE, plane: INTERFACES_PLANE };

function withAxis(axis: 'x' | 'y', changes: Record<string, unknown>): Record<string, unknown> {
  return { ...INTERFACES_PLANE, [axis]: { ...INTERFACES_PLANE[axis], ...changes } };
}

describe('parsePlane and parseMapInput', () => {
  test('accept the standard plane; grid coordinates are cell centres', () => {
    const { model, plane } = parseMapInput(GOOD_MAP);
    expect(model.channels.z0).toEqual({ hartree: 2, fock: 2 });
    expect(plane.resolution).toEqual([24, 16]);
    expect(plane.x.label).toBe('u_perp');
    expect(plane.x.targets).toEqual(INTERFACES_PLANE.x.targets);
    // Cell i of n covers [from + i (to - from)/n, from + (i + 1)(to - from)/n].
    expect(axisValue(plane.x, 24, 0)).toBeCloseTo(-2 + 0.5 * (4 / 24), 15);
    expect(axisValue(plane.x, 24, 23)).toBeCloseTo(2 - 0.5 * (4 / 24), 15);
    expect(axisValue(plane.y, 16, 0)).toBeCloseTo(-2 + 0.125, 15);
    expect(axisValue(plane.y, 16, 8)).toBeCloseTo(0.125, 15);
    // A reversed axis runs from `from` towards `to`.
    const reversed = parsePlane(withAxis('x', { from: 1, to: -1 }));
    expect(axisValue(reversed.x, 4, 0)).toBeCloseTo(0.75, 15);
    expect(axisValue(reversed.x, 4, 3)).toBeCloseTo(-0.75, 15);
  });

  test('a bare number resolution means a square grid; zeeman and valleyZeeman are targets', () => {
    const plane = parsePlane({
      ...withAxis('x', { targets: { zeeman: 1 } }),
      y: { from: 0, to: 1, targets: { valleyZeeman: 2 } },
      resolution: 2,
    });
    expect(plane.resolution).toEqual([2, 2]);
    expect(plane.y.label).toBe('');
    expect(plane.y.targets).toEqual({ valleyZeeman: 2 });
  });

  test('bad targets "x0.foo", "q0.fock", "00.fock", "x0", "x0.fock.re" and "Zeeman" are rejected by name', () => {
    for (const target of ['x0.foo', 'q0.fock', '00.fock', 'x0', 'x0.fock.re', 'Zeeman']) {
      expectFieldError(
        () => parsePlane(withAxis('x', { targets: { [target]: 1 } })),
        `plane.x.targets.${target}`,
        ['unknown target'],
      );
    }
  });

  test('empty targets, a non-number coefficient and a NaN coefficient are rejected', () => {
    expectFieldError(() => parsePlane(withAxis('y', { targets: {} })), 'plane.y.targets');
    expectFieldError(
      () => parsePlane(withAxis('y', { targets: { 'z0.fock': '1' } })),
      'plane.y.targets.z0.fock',
    );
    expectFieldError(
      () => parsePlane(withAxis('y', { targets: { 'z0.fock': Number.NaN } })),
      'plane.y.targets.z0.fock',
    );
  });

  test('from == to is rejected, naming the axis', () => {
    expectFieldError(() => parsePlane(withAxis('x', { from: 1, to: 1 })), 'plane.x.to', [
      'plane.x.from',
    ]);
    expectFieldError(() => parsePlane(withAxis('y', { from: 'a' })), 'plane.y.from');
    expectFieldError(
      () => parsePlane(withAxis('y', { to: Number.POSITIVE_INFINITY })),
      'plane.y.to',
    );
  });

  test('resolution 0, 1, 8193, 2.5, -4 and NaN are rejected (as a number or inside [nx, ny])', () => {
    for (const bad of [0, 1, 8193, 2.5, -4, Number.NaN]) {
      expectFieldError(
        () => parsePlane({ ...INTERFACES_PLANE, resolution: bad }),
        'plane.resolution',
        ['integer'],
      );
      expectFieldError(
        () => parsePlane({ ...INTERFACES_PLANE, resolution: [bad, 24] }),
        'plane.resolution[0]',
      );
      expectFieldError(
        () => parsePlane({ ...INTERFACES_PLANE, resolution: [24, bad] }),
        'plane.resolution[1]',
      );
    }
    // The largest side is accepted; one more is refused with the side, the value and the cap.
    expect(parsePlane({ ...INTERFACES_PLANE, resolution: [2, 8192] }).resolution).toEqual([
      2, 8192,
    ]);
    expectFieldError(
      () => parsePlane({ ...INTERFACES_PLANE, resolution: [12000, 2] }),
      'plane.resolution[0]',
      ['from 2 to 8192, got 12000'],
    );
  });

  test('resolution that is neither a number nor [nx, ny] is rejected', () => {
    for (const bad of ['24', [24], [24, 24, 24], { nx: 24, ny: 24 }, null]) {
      expectFieldError(
        () => parsePlane({ ...INTERFACES_PLANE, resolution: bad }),
        'plane.resolution',
      );
    }
  });

  test('a missing plane, a non-object plane, an unknown plane field and an unknown axis field are rejected', () => {
    expectFieldError(() => parseMapInput(INTERFACES_EXAMPLE), 'plane', ['missing']);
    expectFieldError(() => parseMapInput({ ...INTERFACES_EXAMPLE, plane: [] }), 'plane');
    expectFieldError(() => parsePlane({ ...INTERFACES_PLANE, z: {} }), 'plane.z', [
      'unknown field',
    ]);
    expectFieldError(() => parsePlane(withAxis('x', { step: 1 })), 'plane.x.step');
    expectFieldError(() => parsePlane({ ...INTERFACES_PLANE, y: 3 }), 'plane.y');
  });

  test('parseMapInput validates the model part first', () => {
    expectFieldError(() => parseMapInput({ ...GOOD_MAP, filling: 2 }), 'filling');
  });
});

const TARGET_NAMES: string[] = [
  'zeeman',
  'valleyZeeman',
  ...CHANNELS.flatMap((name) => [`${name}.hartree`, `${name}.fock`]),
];

function pick<T>(list: readonly T[], random: RandomSource): T {
  return list[Math.floor(random() * list.length)]!;
}

function randomTargets(random: RandomSource, forced: string[]): Record<string, number> {
  const targets: Record<string, number> = {};
  for (const name of forced) targets[name] = 2 * random() - 1;
  const count = 1 + Math.floor(random() * 4);
  for (let k = 0; k < count; k++) targets[pick(TARGET_NAMES, random)] = 4 * random() - 2;
  return targets;
}

/** A random model: some channels as numbers, some with fock only, some with both; one-body terms. */
function randomModelJson(random: RandomSource): Record<string, unknown> {
  const channels: Record<string, unknown> = {};
  for (const name of CHANNELS) {
    const kind = random();
    if (kind < 0.25) channels[name] = 2 * random() - 1;
    else if (kind < 0.5) channels[name] = { fock: 2 * random() - 1 };
    else if (kind < 0.75) channels[name] = { hartree: 2 * random() - 1, fock: 2 * random() - 1 };
  }
  return {
    filling: pick([-1, 0, 1], random),
    channels,
    zeeman: random(),
    valleyZeeman: random() - 0.5,
    oneBody: { '0z': 0.1 * random(), z0: -0.1 * random(), [pick(CHANNELS, random)]: random() },
    ...(random() < 0.5 ? { exchange: 2 * random() } : {}),
  };
}

/**
 * The model that a plane point stands for (README, Command line: A Map): every target set to
 * coefficient * t, summed over the axes that name it, everything else from the model; where
 * the axes set only the Fock part of a channel the model does not list, its Hartree part
 * follows (a missing hartree equals fock).
 */
function modelAtPoint(
  json: Record<string, unknown>,
  targets: [Record<string, number>, number][],
): Record<string, unknown> {
  const base = parseModel(json);
  const channels: Record<string, { hartree: number; fock: number }> = {};
  for (const name of CHANNELS) {
    const c = base.channels[name];
    channels[name] = { hartree: c?.hartree ?? 0, fock: c?.fock ?? 0 };
  }
  const set = new Map<string, number>();
  for (const [axisTargets, t] of targets) {
    for (const [name, coefficient] of Object.entries(axisTargets)) {
      set.set(name, (set.get(name) ?? 0) + coefficient * t);
    }
  }
  const out: Record<string, unknown> = { ...json, channels };
  for (const [name, value] of set) {
    if (name === 'zeeman' || name === 'valleyZeeman') out[name] = value;
    else {
      const [channel, part] = name.split('.') as [Channel, 'hartree' | 'fock'];
      channels[channel]![part] = value;
      const unlisted = base.channels[channel] === undefined;
      if (unlisted && part === 'fock' && !set.has(`${channel}.hartree`)) {
        channels[channel]!.hartree = value;
      }
    }
  }
  return out;
}

/** Whether a plane sets the Hartree part of a channel the model does not list, and no Fock part. */
function hartreeAlone(json: Record<string, unknown>, names: string[]): boolean {
  const base = parseModel(json);
  return names.some((name) => {
    const [channel, part] = name.split('.') as [Channel, string];
    return part === 'hartree' && !base.channels[channel] && !names.includes(`${channel}.fock`);
  });
}

function expectSameCouplings(actual: Couplings, expected: Couplings, tolerance: number): void {
  expect(actual.nf).toBe(expected.nf);
  for (const key of ['hartree', 'fock', 'eta', 'kappa'] as const) {
    for (let k = 0; k < 16; k++) {
      expect(Math.abs(actual[key][k]! - expected[key][k]!)).toBeLessThan(tolerance);
    }
  }
  expect(Math.abs(actual.c0 - expected.c0)).toBeLessThan(tolerance);
  expect(Math.abs(actual.identityShift - expected.identityShift)).toBeLessThan(tolerance);
  expect(Math.abs(actual.scale - expected.scale)).toBeLessThan(tolerance);
  expect(actual.exchange).toBe(expected.exchange);
}

describe('PlaneCouplings', () => {
  test('at(x, y) equals couplingsOf the model with every target set to coefficient * value (200 seeded points)', () => {
    const random = seededRandom(0x91a4e);
    let checked = 0;
    for (let m = 0; m < 64; m++) {
      const json = randomModelJson(random);
      // Both axes share a target half of the time: their contributions add (plane.ts).
      const shared = pick(TARGET_NAMES, random);
      const plane = {
        x: { from: -1, to: 2, targets: randomTargets(random, random() < 0.5 ? [shared] : []) },
        y: { from: 3, to: -3, targets: randomTargets(random, [shared]) },
        resolution: [8, 8],
      };
      const names = [...Object.keys(plane.x.targets), ...Object.keys(plane.y.targets)];
      if (hartreeAlone(json, names)) {
        // As "hartree" alone in a channel, refused with one line naming the target.
        expect(() => parseMapInput({ ...json, plane })).toThrow(/Hartree part alone/);
        continue;
      }
      const planeCouplings = new PlaneCouplings(parseMapInput({ ...json, plane }));
      for (let p = 0; p < 5; p++) {
        const x = 6 * random() - 3;
        const y = 6 * random() - 3;
        const expected = couplingsOf(
          parseModel(
            modelAtPoint(json, [
              [plane.x.targets, x],
              [plane.y.targets, y],
            ]),
          ),
        );
        expectSameCouplings(planeCouplings.at(x, y), expected, 1e-13);
      }
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(40);
  });

  test('on the standard plane, at(-1, 2) is the worked point of public/notes.html#closed-forms (uPerp = -1, uZ = 2, E_Z = 0.4)', () => {
    const planeCouplings = new PlaneCouplings(
      parseMapInput({ filling: 0, zeeman: 0.4, plane: INTERFACES_PLANE }),
    );
    const expected = couplingsOf(parseModel(INTERFACES_EXAMPLE));
    expectSameCouplings(planeCouplings.at(-1, 2), expected, 1e-15);
    const at = planeCouplings.at(-1, 2);
    expect(at.hartree[channelIndex('x0')]).toBe(-1);
    expect(at.fock[channelIndex('z0')]).toBe(2);
    expect(at.eta[channelIndex('0z')]).toBeCloseTo(-0.2, 15); // eta_0z = -E_Z / 2
  });

  test('a target replaces the model value of that slot, but a oneBody term on the same matrix stays', () => {
    const json = {
      filling: 0,
      channels: { x0: { hartree: 5, fock: 7 }, z0: { hartree: 3, fock: 4 } },
      zeeman: 9,
      oneBody: { '0z': 0.25 },
    };
    const plane = {
      x: { from: 0, to: 1, targets: { 'x0.fock': 1, zeeman: 2 } },
      y: { from: 0, to: 1, targets: { 'z0.hartree': 1 } },
    };
    const at = new PlaneCouplings(parseMapInput({ ...json, plane })).at(0.5, 0.1);
    expect(at.fock[channelIndex('x0')]).toBe(0.5);
    expect(at.hartree[channelIndex('x0')]).toBe(5);
    expect(at.hartree[channelIndex('z0')]).toBeCloseTo(0.1, 15);
    expect(at.fock[channelIndex('z0')]).toBe(4);
    // E_Z = 2 * 0.5 = 1 replaces 9; eta_0z = 0.25 - E_Z / 2.
    expect(at.eta[channelIndex('0z')]).toBeCloseTo(0.25 - 0.5, 15);
  });
});
