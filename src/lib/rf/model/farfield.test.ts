import { describe, expect, it } from 'vitest';
import { farField, polarization, radiation } from './farfield';
import { solve } from './solver';
import { C0, centreFedDipole, geometryOf } from '$lib/testing/wire-models';

const ETA = 376.730313668; // CODATA 2018 [CODATA2018]
const db = (x: number) => 10 * Math.log10(x);
const built = geometryOf;
const dipole = centreFedDipole;

describe('polarization (IEEE Std 145-2013: right-hand = clockwise seen from behind the wave) [IEEE145]', () => {
	// On the +z axis θ̂ = x̂, φ̂ = ŷ. With e^{jωt}, E = x̂ − jŷ is x̂ cos ωt + ŷ sin ωt: it turns from
	// x to y, clockwise when seen looking along +z, the way the wave travels → right-hand.
	const p = (er: number, ei: number, pr: number, pi: number) =>
		polarization({ e_theta: { re: er, im: ei }, e_phi: { re: pr, im: pi } }, 1);

	it('θ̂ − jφ̂ is RHCP and θ̂ + jφ̂ LHCP, axial ratio 1', () => {
		expect(p(1, 0, 0, -1)).toMatchObject({ sense: 'RHCP', axial_ratio: expect.closeTo(1, 12) });
		expect(p(1, 0, 0, 1)).toMatchObject({ sense: 'LHCP', axial_ratio: expect.closeTo(1, 12) });
	});

	it('an ellipse with axes 1 and ½ has axial ratio 2 (6.02 dB); a line has none', () => {
		expect(p(1, 0, 0, -0.5)).toMatchObject({
			sense: 'RHCP',
			axial_ratio: expect.closeTo(2, 12),
			axial_ratio_db: expect.closeTo(6.0206, 4)
		});
		expect(p(0.6, 0.3, 1.2, 0.6)).toMatchObject({ sense: 'linear', axial_ratio: null }); // both in phase
	});

	it('circular parts carry the power: gain_R + gain_L = total', () => {
		const q = p(1, 0.2, 0.3, -0.8);
		const total = (4 * Math.PI * ((1 + 0.04 + 0.09 + 0.64) / (2 * ETA))) / 1;
		expect(10 ** (q.gain_rhcp_dbic / 10) + 10 ** (q.gain_lhcp_dbic / 10)).toBeCloseTo(total, 12);
	});
});

describe('dipole patterns (Balanis, Antenna Theory 4th ed., ch. 4) [Balanis4]', () => {
	it('short dipole: sin²θ pattern, directivity 1.5 (1.76 dBi), HPBW 90°', () => {
		const l = 0.02;
		const sol = solve(dipole(l, l / 1000, 10), C0); // λ = 1 m
		const u = (th: number) => {
			const e = farField(sol, th, 0.3);
			return Math.hypot(e.e_theta.re, e.e_theta.im) ** 2;
		};
		for (const th of [0.3, 0.7, 1.2])
			expect(u(th) / u(Math.PI / 2)).toBeCloseTo(Math.sin(th) ** 2, 3);
		const r = radiation(sol);
		expect(r.beam.directivity_dbi).toBeCloseTo(db(1.5), 2);
		expect(r.beam.theta_deg).toBeCloseTo(90, 1);
		expect(r.cuts[0].hpbw_deg).toBeCloseTo(90, 0);
	});

	it('half-wave dipole: directivity 1.643 (2.15 dBi), HPBW 78°; omnidirectional across', () => {
		const r = radiation(solve(dipole(0.5, 1e-5, 40), C0));
		expect(r.beam.directivity_dbi).toBeCloseTo(db(1.643), 1);
		expect(r.cuts[0].plane).toBe('vertical');
		expect(Math.abs(r.cuts[0].hpbw_deg! - 78)).toBeLessThan(1);
		expect(r.cuts[1].hpbw_deg).toBeNull(); // the transverse cut is the horizontal plane: no 3 dB fall
		expect(Math.max(...r.cuts[1].gain_dbi) - Math.min(...r.cuts[1].gain_dbi)).toBeLessThan(1e-6);
		expect(r.front_to_back_db).toBeCloseTo(0, 6);
		expect(r.polarization.sense).toBe('linear');
	});

	it('quarter-wave monopole on a perfect ground: directivity 3.28 (5.16 dBi), nothing below ground', () => {
		const g = built(
			{
				ground: true,
				wires: [{ kind: 'wire', from: [0, 0, 0], to: [0, 0, 0.25], radius: 1e-5, segments: 20 }],
				feed: { wire: 1, position: 0 },
				conductivity_s_per_m: null
			},
			C0
		);
		const sol = solve(g, C0);
		const r = radiation(sol);
		expect(r.beam.directivity_dbi).toBeCloseTo(db(3.28), 1);
		const below = farField(sol, 2, 0.5);
		expect(Math.hypot(below.e_theta.re, below.e_theta.im, below.e_phi.re, below.e_phi.im)).toBe(0);
		expect(r.beam.theta_deg).toBeCloseTo(90, 1); // along the ground, so the back is too
		expect(r.front_to_back_db).toBeCloseTo(0, 6);
	});

	it('a horizontal dipole λ/4 over ground beams straight up; its back is under the ground (no F/B)', () => {
		const g = built(
			{
				ground: true,
				wires: [
					{ kind: 'wire', name: 'd', from: [-0.24, 0, 0.25], to: [0.24, 0, 0.25], radius: 1e-3 }
				],
				feed: { wire: 'd', position: 0.5 }
			},
			C0
		);
		const r = radiation(solve(g, C0));
		expect(r.beam.theta_deg).toBeLessThan(0.5);
		expect(r.front_to_back_db).toBeNull();
	});

	it('a lossy wire: gain = directivity + 10·log10(efficiency)', () => {
		const r = radiation(solve(dipole(0.48 * (C0 / 14e6), 0.5e-3, 21, 2e5), 14e6));
		expect(r.efficiency).toBeLessThan(0.98);
		expect(r.beam.gain_dbi).toBeCloseTo(r.beam.directivity_dbi + db(r.efficiency), 10);
	});
});

describe('a reflector behind a dipole (Balanis ch. 10, Yagi–Uda: a longer parasite reflects) [Balanis4]', () => {
	it('puts the beam on the far side of the reflector, with front-to-back above 5 dB', () => {
		const g = built(
			{
				wires: [
					{ kind: 'wire', name: 'driven', from: [0, 0, -0.235], to: [0, 0, 0.235], radius: 2e-3 },
					{
						kind: 'wire',
						name: 'reflector',
						from: [-0.2, 0, -0.26],
						to: [-0.2, 0, 0.26],
						radius: 2e-3
					}
				],
				feed: { wire: 'driven', position: 0.5 }
			},
			C0
		);
		const r = radiation(solve(g, C0));
		expect(r.beam.theta_deg).toBeCloseTo(90, 0);
		expect(Math.cos((r.beam.phi_deg * Math.PI) / 180)).toBeGreaterThan(0.99); // towards +x
		expect(r.front_to_back_db!).toBeGreaterThan(5);
		expect(r.beam.directivity_dbi).toBeGreaterThan(db(1.643) + 2);
	});
});
