import { describe, expect, test } from 'vitest';
import { bondClass, latticePicture } from '../app/probe/latticePicture';
import { LATTICE_COLOURS, latticeSvg } from '../app/probe/latticeSvg';
import {
  PlaneCouplings,
  couplingsOf,
  isSymmetry,
  modelAtPoint,
  modelSymmetry,
  parseMapInput,
  parseModel,
  probeModel,
  type ProbeReport,
} from '../solver/index';
import { INTERFACES_EXAMPLE, standardPlane } from './fixtures';

/** The anisotropic contact model of public/notes.html#energy (H = F). */
function standard(uPerp: number, uZ: number, zeeman: number, valleyZeeman = 0) {
  return parseModel({
    filling: 0,
    channels: { x0: uPerp, y0: uPerp, z0: uZ },
    zeeman,
    valleyZeeman,
  });
}

describe('Probe numbers against closed forms (public/notes.html#closed-forms and public/notes.html#modes)', () => {
  test('CAF: both sublattice spins at cos(theta) = E_Z/(4|uPerp|) from the field, opposite across it, one Goldstone mode (spin about the field)', () => {
    // PRB 85, 155439 (2012), canting of the CAF; its Zeeman symbol is half ours (from memory), so
    // its boundary eps_Z = 2|u_perp| reads E_Z = 4|uPerp| here (public/notes.html#closed-forms,
    // derived). The worked point of public/notes.html#closed-forms: uPerp = -1, uZ = 2, E_Z = 0.4
    // gives E = -2.02.
    for (const zeeman of [0.4, 1.2, 2.8, 3.6]) {
      const p = probeModel(standard(-1, 2, zeeman));
      expect(p.state.phase).toBe('CAF');
      expect(p.state.energy).toBeCloseTo(-2 - zeeman ** 2 / 8, 12);
      const { a, b } = p.sublattices;
      expect(Math.cos(a.angleToField)).toBeCloseTo(zeeman / 4, 10);
      expect(Math.cos(b.angleToField)).toBeCloseTo(zeeman / 4, 10);
      expect(Math.hypot(...a.spin)).toBeCloseTo(1, 10);
      // Across the field the two spins point opposite ways (Neel order in the plane).
      expect(a.spin[0]! + b.spin[0]!).toBeCloseTo(0, 10);
      expect(a.spin[1]! + b.spin[1]!).toBeCloseTo(0, 10);
      expect(p.modes.goldstone).toBe(1);
      expect(p.modes.gapless).toHaveLength(1);
      expect(p.modes.gapless[0]!.generators).toEqual(['0z']);
      expect(p.modes.gapless[0]!.symmetry).toMatch(/spin rotation about the field/);
      expect(p.modes.unexplained).toBe(0);
      // Product spinors: one on each sublattice.
      for (const s of p.spinors) expect(s.entropy).toBeLessThan(1e-9);
    }
  });

  test('F: the Larmor mode sits at E_Z and no mode is gapless (Larmor theorem; Kallin and Halperin, PRB 30, 5655 (1984), spin wave at k = 0)', () => {
    for (const [h, f, zeeman] of [
      [1, 1, 0.3],
      [0.4, 0.25, 0.9],
    ] as const) {
      const p = probeModel(
        parseModel({
          filling: 0,
          channels: {
            x0: { hartree: h, fock: f },
            y0: { hartree: h, fock: f },
            z0: { hartree: 2 * h, fock: 2 * f },
          },
          zeeman,
        }),
      );
      expect(p.state.phase).toBe('F');
      expect(p.modes.goldstone).toBe(0);
      expect(p.modes.broken).toEqual([]);
      expect(Math.min(...p.modes.frequencies)).toBeCloseTo(zeeman, 10);
      // Both sublattices carry spin 1 (two electrons) along the field.
      expect(p.sublattices.a.spin[2]).toBeCloseTo(1, 12);
      expect(p.sublattices.b.spin[2]).toBeCloseTo(1, 12);
      expect(p.sublattices.a.angleToField).toBeCloseTo(0, 12);
    }
  });

  test('CDW: both electrons on sublattice A when Delta_V > 0, energy 2 uZ_H - uZ_F - Delta_V (public/notes.html#closed-forms)', () => {
    const p = probeModel(standard(-0.5, -1, 0.1, 0.2));
    expect(p.state.phase).toBe('CDW');
    expect(p.state.energy).toBeCloseTo(2 * -1 - -1 - 0.2, 12);
    expect(p.sublattices.a.charge).toBeCloseTo(2, 12);
    expect(p.sublattices.b.charge).toBeCloseTo(0, 12);
    expect(p.bonds.amplitude).toBeLessThan(1e-9);
    // The lattice picture puts the charge on the A sites only, and all bonds equal.
    const pic = latticePicture(p);
    for (const s of pic.sites) expect(s.charge).toBeCloseTo(s.sublattice === 'A' ? 2 : 0, 12);
    expect(pic.maxModulation).toBe(0);
  });

  test('KD: three bond strengths Re[Delta w^m] in the Kekule pattern, every site touching one bond of each class', () => {
    // KD energy 2 uPerp_H - uPerp_F wins over CDW (uZ) when uZ > uPerp
    // (public/notes.html#closed-forms).
    const p = probeModel(standard(-1, 0.5, 0.1));
    expect(p.state.phase).toBe('KD');
    expect(p.state.energy).toBeCloseTo(-1, 12);
    // The projector (1 + tau_x)/2 (x) 1 has |o_x0 + i o_y0| = 2.
    expect(p.bonds.amplitude).toBeCloseTo(2, 10);
    const { strengths, phase, amplitude } = p.bonds;
    strengths.forEach((s, m) =>
      expect(s).toBeCloseTo(amplitude * Math.cos(phase + (2 * Math.PI * m) / 3), 12),
    );
    expect(strengths[0]! + strengths[1]! + strengths[2]!).toBeCloseTo(0, 12);
    // In the canonical gauge the phase is 0: one strong class (2), two weak ones (-1, -1).
    expect(phase).toBeCloseTo(0, 10);
    expect(strengths.map((s) => Number(s.toFixed(9)))).toEqual([2, -1, -1]);

    const pic = latticePicture(p);
    const key = (x: number, y: number) => `${x.toFixed(6)},${y.toFixed(6)}`;
    const classesAt = new Map<string, number[]>();
    for (const bond of pic.bonds) {
      for (const end of [key(bond.x1, bond.y1), key(bond.x2, bond.y2)]) {
        classesAt.set(end, [...(classesAt.get(end) ?? []), bond.bondClass]);
      }
      expect(bond.modulation).toBeCloseTo(strengths[bond.bondClass]!, 12);
    }
    let full = 0;
    for (const classes of classesAt.values()) {
      if (classes.length === 3) {
        full++;
        expect([...classes].sort()).toEqual([0, 1, 2]);
      }
    }
    expect(full).toBeGreaterThan(20);
    // Spin-free bond order: both spins carry half of it.
    expect(p.bonds.bySpin.up.amplitude).toBeCloseTo(1, 10);
    expect(p.bonds.bySpin.down.amplitude).toBeCloseTo(1, 10);
    expect(p.modes.gapless.map((m) => m.generators)).toEqual([['z0']]);
  });

  test('bond classes repeat with the three-site period of K - K\u2032', () => {
    for (let n1 = -4; n1 <= 4; n1++) {
      for (let n2 = -4; n2 <= 4; n2++) {
        for (let j = 0; j < 3; j++) {
          expect(bondClass(n1 + 1, n2 + 1, j)).toBe(bondClass(n1, n2, j));
          expect(bondClass(n1 + 3, n2, j)).toBe(bondClass(n1, n2, j));
          expect(bondClass(n1 + 1, n2, j)).not.toBe(bondClass(n1, n2, j));
        }
      }
    }
  });
});

describe('spin-valley entanglement of the occupied spinors', () => {
  test('a spin-valley Bell state is maximally entangled: entropy 1 bit, concurrence 1', () => {
    // nu = -1 (one electron) with Hartree-only xx, yy, zz channels: E = H (o_xx^2 + o_yy^2 +
    // o_zz^2) / 2 with H < 0. A product spinor has sum n_a^2 m_a^2 <= 1; the maximum 3 needs
    // |o_aa| = 1 for all three, which only maximally entangled spinors reach (derived here from
    // public/notes.html#energy; Nielsen and Chuang (2000), section 2.5).
    const hartreeOnly = { hartree: -1, fock: 0 };
    const p = probeModel(
      parseModel({
        filling: -1,
        channels: { xx: hartreeOnly, yy: hartreeOnly, zz: hartreeOnly },
        zeeman: 0,
      }),
    );
    for (const ch of ['xx', 'yy', 'zz']) expect(Math.abs(p.state.order[ch]!)).toBeCloseTo(1, 10);
    expect(p.spinors).toHaveLength(1);
    expect(p.spinors[0]!.entropy).toBeCloseTo(1, 9);
    expect(p.spinors[0]!.concurrence).toBeCloseTo(1, 9);
    // Moduli 1/sqrt 2 on two flavours, zero on the others.
    const moduli = [...p.spinors[0]!.modulus].sort();
    [0, 0, Math.SQRT1_2, Math.SQRT1_2].forEach((m, k) => expect(moduli[k]).toBeCloseTo(m, 9));
  });

  test('a product of spin and valley states has entropy 0 (CDW, F, KD)', () => {
    for (const model of [
      standard(-0.5, -1, 0.1, 0.2),
      standard(1, 2, 0.3),
      standard(-1, 0.5, 0.1),
    ]) {
      for (const s of probeModel(model).spinors) {
        expect(s.entropy).toBeLessThan(1e-9);
        expect(Math.hypot(...s.modulus)).toBeCloseTo(1, 12);
      }
    }
  });
});

describe('symmetries and gapless modes', () => {
  test('the rotation test agrees with the U(1) and SU(2) checks of the model', () => {
    for (const zeeman of [0, 0.4]) {
      for (const model of [
        standard(-1, 2, zeeman),
        parseMapInput({ ...INTERFACES_EXAMPLE, plane: standardPlane(4, 4) }).model,
      ]) {
        const c = couplingsOf(model);
        const s = modelSymmetry(c);
        expect(isSymmetry(c, 3)).toBe(s.spinRotationAboutField);
        expect(isSymmetry(c, 1) && isSymmetry(c, 2)).toBe(s.spinIsotropic);
        expect(isSymmetry(c, 12)).toBe(s.valleyRotation);
      }
    }
  });

  test('a ferromagnet without Zeeman energy has one gapless pair for its two broken spin generators (public/notes.html#modes)', () => {
    const p = probeModel(parseModel({ filling: 0, channels: { x0: 1, y0: 1, z0: 2 }, zeeman: 0 }));
    expect(p.modes.goldstone).toBe(1);
    expect(p.modes.gapless).toHaveLength(1);
    expect(p.modes.gapless[0]!.kind).toBe('paired');
    expect([...p.modes.gapless[0]!.generators].sort()).toEqual(['0x', '0y']);
  });

  test('every gapless pair is accounted for at generic points of the standard plane', () => {
    for (const [uPerp, uZ, zeeman] of [
      [-1, 2, 0.4],
      [0.6, 1.5, 0.3],
      [-1.5, -0.4, 0.2],
      [0.8, -1.6, 0.5],
    ] as const) {
      const p = probeModel(standard(uPerp, uZ, zeeman));
      expect(p.modes.gapless.length).toBe(p.modes.goldstone);
      expect(p.modes.unexplained).toBe(0);
    }
  });
});

describe('the Probe of a plane point', () => {
  test('modelAtPoint stands for the same couplings as the Map at that point', () => {
    const input = parseMapInput({
      ...INTERFACES_EXAMPLE,
      channels: { ...INTERFACES_EXAMPLE.channels, zx: { hartree: 0.3, fock: -0.2 } },
      plane: {
        ...standardPlane(8, 8),
        y: { label: 'E_Z', from: 0, to: 2, targets: { zeeman: 1, 'zx.fock': 0.5 } },
      },
    });
    const plane = new PlaneCouplings(input);
    for (const [x, y] of [
      [-1.3, 0.2],
      [0.7, 1.9],
    ] as const) {
      const expected = plane.at(x, y);
      const actual = couplingsOf(modelAtPoint(input, x, y));
      for (const key of ['hartree', 'fock', 'eta', 'kappa'] as const) {
        for (let k = 0; k < 16; k++) expect(actual[key][k]).toBeCloseTo(expected[key][k]!, 12);
      }
    }
  });

  test('competitors: the other state families with their height above the ground state, from the closed forms of public/notes.html#closed-forms', () => {
    // Near the F/CDW line (uPerp > 0) the F state lies E_F - E_CDW = (-2 uPerp - uZ - E_Z) - uZ
    // above; near the KD/CDW line (uPerp < 0) the CDW lies uZ - uPerp above the KD (H = F).
    const nearF: ProbeReport = probeModel(standard(0.5, -0.6, 0.1));
    expect(nearF.competitors[0]).toMatchObject({ phase: 'CDW', above: 0, unstable: 0 });
    const f = nearF.competitors.find((c) => c.phase === 'F');
    expect(f!.above).toBeCloseTo(-2 * 0.5 + 0.6 - 0.1 - -0.6, 10);
    expect(f!.unstable).toBeGreaterThan(0);
    const nearKd = probeModel(standard(-1, -0.9, 0.1));
    expect(nearKd.competitors[0]).toMatchObject({ phase: 'KD', above: 0 });
    const saddle = nearKd.competitors.find((c) => c.phase === 'CDW');
    expect(saddle!.above).toBeCloseTo(-0.9 - -1, 10);
    // Listed by energy.
    const above = nearKd.competitors.map((c) => c.above);
    expect(above).toEqual([...above].sort((a, b) => a - b));
    // CDW on the other sublattice: E = 2 uZ_H - uZ_F +- Delta_V, so 2 Delta_V above.
    const cdw = probeModel(standard(-0.5, -1, 0.1, 0.2));
    expect(cdw.competitors[0]).toMatchObject({ phase: 'CDW', note: 'charge on A', above: 0 });
    const other = cdw.competitors.find((c) => c.note === 'charge on B');
    expect(other).toMatchObject({ phase: 'CDW', unstable: 0, count: 1 });
    expect(other!.above).toBeCloseTo(2 * 0.2, 10);
  });

  test('the lattice SVG is one SVG 1.1 document with a title and no raster', () => {
    const svg = latticeSvg(probeModel(standard(-1, 2, 0.4)), 'Pin 1');
    expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg ')).toBe(true);
    expect(svg).toContain('version="1.1"');
    expect(svg).toContain('<title>Fourfold Probe lattice picture: CAF</title>');
    expect(svg).not.toMatch(/<image|data:image/);
    // CAF spins: arrows across the field on every site, and a dot (along the field) on each.
    expect((svg.match(/<path d="M[^"]*Z" fill="#1d2126"/g) ?? []).length).toBeGreaterThan(20);
    // The key: each sublattice's site colour as its sites have it, and the dashed cell.
    const siteFill = (sub: string) =>
      new RegExp(`<circle [^>]*fill="([^"]+)"[^>]*data-sublattice="${sub}"`).exec(svg)![1];
    const keyFill = (sub: string) =>
      new RegExp(`<circle [^>]*fill="([^"]+)" data-key="${sub}"`).exec(svg)![1];
    expect(keyFill('A')).toBe(siteFill('A'));
    expect(keyFill('B')).toBe(siteFill('B'));
    expect(keyFill('A')).not.toBe(keyFill('B'));
    expect(svg).toMatch(/<path [^>]*stroke-dasharray="4 3" data-key="cell"\/><text[^>]*>Dashed: /);
  });

  test('SBxy: each bond carries the spin across the field Re[(o_xb + i o_yb) w^m], drawn as a keyed arrow on the bond', () => {
    // An invented point of our own: Hartree 1.2 x Fock for uPerp and 0.7 x Fock for uZ (as the
    // demo), uPerp = 0.5, uZ = -1, E_Z = 0.6; its ground state is SBxy with o_xx the only
    // in-plane spin bond component (value found by this solver, not an outside source).
    const sbxy = probeModel(
      parseModel({
        filling: 0,
        channels: {
          x0: { fock: 0.5, hartree: 0.6 },
          y0: { fock: 0.5, hartree: 0.6 },
          z0: { fock: -1, hartree: -0.7 },
        },
        zeeman: 0.6,
      }),
    );
    expect(sbxy.state.phase).toBe('SBxy');
    const o = sbxy.state.order;
    const oxx = o['xx']!;
    expect(Math.abs(oxx)).toBeGreaterThan(1);
    const pic = latticePicture(sbxy);
    // No charge bond order, no spin bond order along the field: the bond strokes stay equal.
    expect(pic.maxModulation).toBe(0);
    const w = (m: number) => [Math.cos((2 * Math.PI * m) / 3), Math.sin((2 * Math.PI * m) / 3)];
    const across = (re: number, im: number, m: number) => re * w(m)[0]! - im * w(m)[1]!;
    for (const bond of pic.bonds) {
      const m = bond.bondClass;
      expect(bond.spinAcross[0]).toBeCloseTo(across(o['xx']!, o['yx']!, m), 12);
      expect(bond.spinAcross[1]).toBeCloseTo(across(o['xy']!, o['yy']!, m), 12);
    }
    // With o_xx alone: class 0 carries o_xx along x, classes 1 and 2 carry -o_xx / 2 each.
    const class0 = pic.bonds.find((bd) => bd.bondClass === 0)!;
    const class1 = pic.bonds.find((bd) => bd.bondClass === 1)!;
    expect(class0.spinAcross[0]).toBeCloseTo(oxx, 10);
    expect(class1.spinAcross[0]).toBeCloseTo(-oxx / 2, 10);
    expect(pic.maxSpinAcross).toBeCloseTo(Math.abs(oxx), 10);

    const svg = latticeSvg(sbxy);
    const arrows = [
      ...svg.matchAll(
        /<path [^>]*stroke="([^"]+)"[^>]*data-class="(\d)" data-bond-spin="([^"]+)"/g,
      ),
    ];
    expect(arrows.length).toBe(pic.bonds.length);
    // Distinct from the bond strokes and the site arrows; the key shows the same mark.
    const colour = arrows[0]![1];
    expect(arrows.every((a) => a[1] === colour)).toBe(true);
    expect([
      LATTICE_COLOURS.bondPlain,
      LATTICE_COLOURS.arrow,
      LATTICE_COLOURS.spinUp,
    ]).not.toContain(colour);
    expect(svg).toMatch(
      new RegExp(
        `<path [^>]*stroke="${colour}"[^>]*data-key="bondSpin"\\/><text[^>]*>Bond arrows: spin across the field \\(in-plane spin bond order\\)`,
      ),
    );
    for (const [, , cls, value] of arrows) {
      const [sx, sy] = value!.split(',').map(Number);
      expect(sx).toBeCloseTo(Number(cls) === 0 ? oxx : -oxx / 2, 2);
      expect(sy).toBeCloseTo(0, 2);
    }
    expect(svg).toContain('No charge bond order: all bonds equal in width');

    // KD and CAF have no in-plane spin bond order: no bond arrows, no key line for them.
    for (const other of [probeModel(standard(-1, 0.5, 0.1)), probeModel(standard(-1, 2, 0.4))]) {
      expect(latticePicture(other).maxSpinAcross).toBeLessThan(1e-9);
      const doc = latticeSvg(other);
      expect(doc).not.toContain('data-bond-spin');
      expect(doc).not.toContain('data-key="bondSpin"');
    }
  });
});
