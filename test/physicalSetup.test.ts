import { describe, expect, test } from 'vitest';
import { errorOf } from './fixtures';
import {
  BOHR_MAGNETON,
  ELEMENTARY_CHARGE,
  magneticLength,
  parseMapInput,
  parseModel,
  seededRandom,
  solve,
} from '../solver/index';
import { DEMO_SETUP } from '../app/scenario/demo';
import {
  derivedSetup,
  physicalScales,
  toDimensionlessUnits,
  toPhysicalUnits,
  withPhysical,
  zeemanAtTilt,
} from '../app/scenario/physical';
import { scenarioToSetup, setupToScenario } from '../app/scenario/scenario';
import { parseScenarioFile, scenarioFileText } from '../app/scenario/scenarioFile';
import { zeroChannels, type PhysicalSetup, type Setup } from '../app/scenario/setup';
import { checkSetup } from '../app/scenario/setupCheck';
import { readScenarioHash, scenarioHash } from '../app/scenario/urlState';
import { tiltTrajectory } from '../app/setup/tiltTrajectory';
import { sampleAt } from '../app/setup/samplePlacement';

const DEG = Math.PI / 180;

/** E_Z in meV from the defining formula g mu_B B_perp / cos(tilt) (public/notes.html#units). */
function zeemanFormula(b: number, tiltDeg: number, g: number): number {
  return (g * BOHR_MAGNETON * b) / Math.cos(tiltDeg * DEG) / (ELEMENTARY_CHARGE * 1e-3);
}

/** An invented sample: u~_perp = -0.12 meV/T (H/F = 0.9), u~_z = 0.3 meV/T, 8 T tilted 40 deg. */
const PHYSICAL: PhysicalSetup = {
  bPerpTesla: 8,
  tiltDeg: 40,
  gFactor: 2,
  epsilonR: 5,
  exchangeInGap: true,
  tiltMaxDeg: 80,
};

function sample(extra: Partial<Setup> = {}): Setup {
  const b = PHYSICAL.bPerpTesla;
  return derivedSetup({
    ...DEMO_SETUP,
    channels: {
      ...zeroChannels(),
      x0: { hartree: -0.108 * b, fock: -0.12 * b },
      y0: { hartree: -0.108 * b, fock: -0.12 * b },
      z0: { hartree: 0.3 * b, fock: 0.3 * b },
    },
    ratios: { uPerp: 0.9, uZ: 1 },
    resolution: [32, 32],
    physical: PHYSICAL,
    ...extra,
  });
}

describe('physical units in the Setup (public/notes.html#units)', () => {
  test('E_Z follows B_perp, tilt and g; couplings typed in meV/T scale with B_perp', () => {
    const s = sample();
    expect(s.zeeman / zeemanFormula(8, 40, 2)).toBeCloseTo(1, 12);
    const moved = withPhysical(s, { ...PHYSICAL, bPerpTesla: 12, tiltDeg: 60, gFactor: 1.9 });
    expect(moved.zeeman / zeemanFormula(12, 60, 1.9)).toBeCloseTo(1, 12);
    expect(moved.channels.x0.fock / 12).toBeCloseTo(-0.12, 14);
    expect(moved.channels.z0.hartree / 12).toBeCloseTo(0.3, 14);
    expect(zeemanAtTilt(PHYSICAL, 60) / zeemanAtTilt(PHYSICAL, 0)).toBeCloseTo(2, 12);
  });

  test('derived scales: l_B ~ 1/sqrt(B), E_X = sqrt(pi/2) e^2/(eps l_B), E_1 = 36.3 meV sqrt(B/T)', () => {
    const scales = physicalScales(PHYSICAL);
    expect(scales.magneticLengthNm).toBeCloseTo(25.6556 / Math.sqrt(8), 3);
    expect(scales.exchangeMeV / scales.coulombMeV).toBeCloseTo(Math.sqrt(Math.PI / 2), 12);
    // Castro Neto et al., RMP 81, 109 (2009): 36.3 meV at 1 T for v_F = 1e6 m/s.
    expect(scales.landauLevelMeV / Math.sqrt(8)).toBeCloseTo(36.3, 1);
    expect(scales.mixing).toBeCloseTo(scales.coulombMeV / (scales.landauLevelMeV / Math.SQRT2), 12);
  });

  test('switching units keeps the Map: the energies are read as meV and E_Z stays exactly', () => {
    const physical = toPhysicalUnits(DEMO_SETUP);
    // B_perp = E_Z / (g mu_B) = 0.6 meV / (2 x 0.0578838 meV/T) = 5.182796 T (CODATA 2018 mu_B).
    expect(physical.physical?.bPerpTesla).toBeCloseTo(5.182796, 5);
    expect(physical.zeeman).toBe(DEMO_SETUP.zeeman);
    expect(physical.channels).toEqual(DEMO_SETUP.channels);
    const back = toDimensionlessUnits(physical);
    expect(back.physical).toBeUndefined();
    expect(back.zeeman).toBe(DEMO_SETUP.zeeman);
    // Any E_Z within the field's range comes back bit for bit.
    const random = seededRandom(7);
    for (let k = 0; k < 500; k++) {
      const zeeman = 0.002 + 5 * random() ** 3;
      expect(toPhysicalUnits({ ...DEMO_SETUP, zeeman }).zeeman).toBe(zeeman);
    }
  });

  test('E_X in the gap survives a switch of units both ways', () => {
    const physical = toPhysicalUnits({ ...DEMO_SETUP, exchange: 0.4 });
    expect(physical.physical?.exchangeInGap).toBe(true);
    expect(physical.exchange).toBeUndefined();
    const back = toDimensionlessUnits(physical);
    expect(back.exchange).toBe(physicalScales(physical.physical!).exchangeMeV);
    expect(toDimensionlessUnits(toPhysicalUnits(DEMO_SETUP)).exchange).toBeUndefined();
  });

  test('round trip through the scenario file, the URL and autosave, and the CLI reads the file', () => {
    const s = sample({
      ranges: { z0: { profile: 'screened', strength: 0.3, range: 6 } },
    });
    const text = scenarioFileText(s);
    const json = JSON.parse(text);
    expect(json.fourfold.version).toBeTypeOf('string');
    expect(json.fourfold.physical).toEqual(PHYSICAL);
    expect(json.exchange).toBeCloseTo(physicalScales(PHYSICAL).exchangeMeV, 12);
    expect(parseScenarioFile(text, 'file')).toEqual(s);
    expect(readScenarioHash(scenarioHash(s))).toEqual(s);
    expect(scenarioToSetup(JSON.parse(JSON.stringify(setupToScenario(s))))).toEqual(s);
    // What `npm run map -- --model FILE` parses: the model in meV, E_X as `exchange`.
    const input = parseMapInput(json);
    expect(input.model.zeeman).toBeCloseTo(zeemanFormula(8, 40, 2), 12);
    expect(input.model.exchange).toBeCloseTo(physicalScales(PHYSICAL).exchangeMeV, 12);
    expect(input.model.channels.x0?.fock).toBeCloseTo(-0.96, 14);
  });

  test('a hand-edited file whose model disagrees with its physical block is refused with one line', () => {
    const json = JSON.parse(scenarioFileText(sample()));
    expect(errorOf(() => scenarioToSetup({ ...json, zeeman: 1 }))).toMatch(
      /^zeeman: 1 disagrees with g mu_B B_perp/,
    );
    const bad = (physical: Record<string, unknown>) =>
      errorOf(() => scenarioToSetup({ ...json, fourfold: { physical } }));
    expect(bad({ ...PHYSICAL, tiltDeg: 95 })).toMatch(/^fourfold\.physical\.tiltDeg: below 90°/);
    expect(bad({ ...PHYSICAL, bPerpTesla: -3 })).toMatch(
      /^fourfold\.physical\.bPerpTesla: a positive/,
    );
    expect(bad({ ...PHYSICAL, gFactor: 'two' })).toMatch(
      /^fourfold\.physical\.gFactor: expected a finite/,
    );
    expect(bad({ ...PHYSICAL, field: 3 })).toMatch(/^fourfold\.physical\.field: unknown field/);
    expect(
      errorOf(() =>
        scenarioToSetup({
          ...json,
          fourfold: { ranges: { x0: { profile: 'cubic', strength: 1, range: 1 } } },
        }),
      ),
    ).toMatch(/^fourfold\.ranges\.x0\.profile: expected one of/);
    expect(checkSetup({ ...sample(), physical: { ...PHYSICAL, tiltDeg: NaN } })).toMatch(
      /^physical\.tiltDeg: expected a finite number/,
    );
  });

  test('a range channel: H = strength x B_perp, F by quadrature with a / l_B; switching units keeps both', () => {
    const s = sample({ ranges: { x0: { profile: 'gaussian', strength: -0.1, range: 6 } } });
    const aOverL = 6 / (magneticLength(8) * 1e9);
    expect(s.channels.x0.hartree).toBeCloseTo(-0.8, 14);
    expect(s.channels.x0.fock / s.channels.x0.hartree).toBeCloseTo(1 / (1 + aOverL ** 2), 13);
    expect(s.ratios.uPerp).toBeCloseTo(1 + aOverL ** 2, 12);
    const dimensionless = toDimensionlessUnits(s);
    expect(dimensionless.ranges?.x0?.range).toBeCloseTo(aOverL, 14);
    expect(dimensionless.channels.x0.fock).toBeCloseTo(s.channels.x0.fock, 13);
    const stronger = withPhysical(s, { ...PHYSICAL, bPerpTesla: 16 });
    // F/H falls with field for a fixed range in nm (l_B shrinks).
    expect(stronger.channels.x0.fock / stronger.channels.x0.hartree).toBeLessThan(
      s.channels.x0.fock / s.channels.x0.hartree,
    );
  });
});

describe('tilt path on the Map', () => {
  test('(u_perp, u_z) axes: a ray towards the origin through the sample, u cos(theta) / cos(current)', () => {
    const s = sample();
    const path = tiltTrajectory(s)!;
    expect(path.kind).toBe('scaled');
    expect(path.exact).toBe(true);
    expect(path.current[0]).toBeCloseTo(s.channels.x0.fock, 12);
    expect(path.current[1]).toBeCloseTo(s.channels.z0.fock, 12);
    const cosNow = Math.cos(40 * DEG);
    path.points.forEach((p, k) => {
      const c = Math.cos(path.tilts[k]! * DEG) / cosNow;
      expect(p[0]).toBeCloseTo(c * s.channels.x0.fock, 12);
      expect(p[1]).toBeCloseTo(c * s.channels.z0.fock, 12);
    });
    expect(tiltTrajectory(sample({ valleyZeeman: 0.2 }))!.exact).toBe(false);
    // A Hartree part off the axis ratio puts the sample beside the plane.
    expect(tiltTrajectory(sample({ ratios: { uPerp: 0.5, uZ: 1 } }))!.exact).toBe(false);
  });

  test('the ray is physical: the sample at each tilt has the state of its point on the Map (derived from public/notes.html#energy)', () => {
    // A sample near the CAF/F boundary E_Z = 4|u_perp| (public/notes.html#closed-forms): the tilt
    // crosses it.
    const s = sample({
      channels: {
        ...zeroChannels(),
        x0: { hartree: -0.03 * 8, fock: -0.03 * 8 },
        y0: { hartree: -0.03 * 8, fock: -0.03 * 8 },
        z0: { hartree: 0.2 * 8, fock: 0.2 * 8 },
      },
      ratios: { uPerp: 1, uZ: 1 },
    });
    const path = tiltTrajectory(s)!;
    const phases = new Set<string>();
    path.tilts.forEach((tilt, k) => {
      const [u, uz] = path.points[k]!;
      const onMap = solve(
        parseModel({ filling: 0, channels: { x0: u, y0: u, z0: uz }, zeeman: s.zeeman }),
      );
      const uPerpSample = s.channels.x0.fock;
      const real = solve(
        parseModel({
          filling: 0,
          channels: { x0: uPerpSample, y0: uPerpSample, z0: s.channels.z0.fock },
          zeeman: zeemanAtTilt(PHYSICAL, tilt),
        }),
      );
      expect(onMap.phase).toBe(real.phase);
      // Energies scale by the same factor E_Z(current) / E_Z(theta).
      const lambda = s.zeeman / zeemanAtTilt(PHYSICAL, tilt);
      expect(onMap.energy).toBeCloseTo(lambda * real.energy, 10);
      phases.add(real.phase);
    });
    expect([...phases].sort()).toEqual(['CAF', 'F']);
  });

  test('an E_Z axis: the sample moves along it from E_Z(0) to E_Z(max), exactly', () => {
    const s = sample({ y: { quantity: 'zeeman', from: 0, to: 10, hartreeRatio: 1 } });
    const path = tiltTrajectory(s)!;
    expect(path.kind).toBe('zeeman');
    expect(path.points[0]![1]).toBeCloseTo(zeemanFormula(8, 0, 2), 12);
    expect(path.points[path.points.length - 1]![1]).toBeCloseTo(zeemanFormula(8, 80, 2), 12);
    expect(path.points.every((p) => p[0] === s.channels.x0.fock)).toBe(true);
    expect(tiltTrajectory(DEMO_SETUP)).toBeNull();
  });
});

describe('the sample at a pinned point', () => {
  test('puts the tilt path through the pin, exactly, and ends on the ray towards the origin', () => {
    const physical = {
      ...toPhysicalUnits(DEMO_SETUP),
      physical: { ...toPhysicalUnits(DEMO_SETUP).physical!, tiltDeg: 30 },
    };
    const placed = derivedSetup({ ...physical, ...sampleAt(physical, -0.7, 0.9) });
    // The Map's targets at the pin: x0, y0 Fock -0.7 and Hartree 1.2 * -0.7; z0 0.9 and 0.7 * 0.9.
    expect(placed.channels.x0).toEqual({ hartree: 1.2 * -0.7, fock: -0.7 });
    expect(placed.channels.y0).toEqual({ hartree: 1.2 * -0.7, fock: -0.7 });
    expect(placed.channels.z0.fock).toBeCloseTo(0.9, 12);
    expect(placed.channels.z0.hartree).toBeCloseTo(0.7 * 0.9, 12);
    const path = tiltTrajectory(placed)!;
    expect(path.exact).toBe(true);
    expect(path.current[0]).toBeCloseTo(-0.7, 12);
    expect(path.current[1]).toBeCloseTo(0.9, 12);
    // At the largest tilt the point is the pin scaled by cos(theta_max) / cos(theta_now)
    // (public/notes.html#units).
    const last = path.points[path.points.length - 1]!;
    const scale =
      Math.cos((placed.physical!.tiltMaxDeg * Math.PI) / 180) /
      Math.cos((placed.physical!.tiltDeg * Math.PI) / 180);
    expect(last[0]).toBeCloseTo(-0.7 * scale, 12);
    expect(last[1]).toBeCloseTo(0.9 * scale, 12);
  });
});
