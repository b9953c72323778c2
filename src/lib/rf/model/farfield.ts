import { C, ETA0 } from './limits';
import type { Complex, Solution } from './solver';

/**
 * Far field of the solved currents (Balanis, Antenna Theory 4th ed., ch. 3 and 4 [Balanis4]):
 * r·E = −j η k/(4π) · N⊥, N = Σ ∫ I(l′) û e^{jk r̂·r′} dl′, each segment's linear current
 * integrated in closed form; images (current reversed) below a ground plane, and no field under it.
 * Radiation intensity U = |r·E|²/(2η); gain 4πU/P_in, directivity 4πU/P_rad with
 * P_rad = P_in − wire loss − load loss. Circular components use the IEEE convention (IEEE Std
 * 145-2013 [IEEE145]): right-hand = clockwise seen from behind the wave, e_R = (θ̂ − jφ̂)/√2 for
 * e^{jωt}, so E_R = (E_θ + jE_φ)/√2 and E_L = (E_θ − jE_φ)/√2.
 */

export interface FarField {
	e_theta: Complex;
	e_phi: Complex;
}

const DEG = Math.PI / 180;
/** dB, floored at −200 dB so that nulls stay finite numbers in JSON. */
const DB_FLOOR = -200;
const toDb = (g: number) => Math.max(DB_FLOOR, 10 * Math.log10(g));

/** ∫₀¹ e^{jψt} dt and ∫₀¹ t e^{jψt} dt. */
function phaseIntegrals(psi: number, out: Float64Array): void {
	if (Math.abs(psi) < 1e-2) {
		const p2 = psi * psi;
		out[0] = 1 - p2 / 6;
		out[1] = psi / 2 - (p2 * psi) / 24;
		out[2] = 0.5 - p2 / 8;
		out[3] = psi / 3 - (p2 * psi) / 30;
		return;
	}
	const s = Math.sin(psi);
	const c = Math.cos(psi);
	out[0] = s / psi;
	out[1] = (1 - c) / psi;
	out[2] = s / psi + (c - 1) / (psi * psi);
	out[3] = -c / psi + s / (psi * psi);
}

const F = new Float64Array(4);

/** r·E (V, for 1 V at the feed) towards (θ, φ) in radians; zero under a ground plane. */
export function farField(sol: Solution, theta: number, phi: number): FarField {
	const g = sol.geometry;
	const zero = { e_theta: { re: 0, im: 0 }, e_phi: { re: 0, im: 0 } };
	const st = Math.sin(theta),
		ct = Math.cos(theta),
		sp = Math.sin(phi),
		cp = Math.cos(phi);
	if (g.images && ct < -1e-12) return zero;
	const k = (2 * Math.PI * sol.f_hz) / C;
	const rx = st * cp,
		ry = st * sp,
		rz = ct;
	let nxr = 0,
		nxi = 0,
		nyr = 0,
		nyi = 0,
		nzr = 0,
		nzi = 0;
	const sets = g.images ? [g.segments, g.images] : [g.segments];
	for (let si = 0; si < sets.length; si++) {
		const S = sets[si];
		const sign = si === 0 ? 1 : -1;
		for (let p = 0; p < S.n; p++) {
			const len = S.len[p];
			const ux = S.ux[p],
				uy = S.uy[p],
				uz = S.uz[p];
			phaseIntegrals(k * len * (rx * ux + ry * uy + rz * uz), F);
			const ar = sol.i_start[2 * p],
				ai = sol.i_start[2 * p + 1];
			const dr = sol.i_end[2 * p] - ar,
				di = sol.i_end[2 * p + 1] - ai;
			// I_a F0 + (I_b − I_a) F1
			const ir = ar * F[0] - ai * F[1] + dr * F[2] - di * F[3];
			const ii = ar * F[1] + ai * F[0] + dr * F[3] + di * F[2];
			const ph = k * (rx * S.sx[p] + ry * S.sy[p] + rz * S.sz[p]);
			const c = Math.cos(ph) * len * sign,
				s = Math.sin(ph) * len * sign;
			const vr = ir * c - ii * s;
			const vi = ir * s + ii * c;
			nxr += ux * vr;
			nxi += ux * vi;
			nyr += uy * vr;
			nyi += uy * vi;
			nzr += uz * vr;
			nzi += uz * vi;
		}
	}
	const tx = ct * cp,
		ty = ct * sp,
		tz = -st;
	const ntr = nxr * tx + nyr * ty + nzr * tz;
	const nti = nxi * tx + nyi * ty + nzi * tz;
	const npr = -nxr * sp + nyr * cp;
	const npi = -nxi * sp + nyi * cp;
	const f = (ETA0 * k) / (4 * Math.PI);
	// −j f N
	return { e_theta: { re: f * nti, im: -f * ntr }, e_phi: { re: f * npi, im: -f * npr } };
}

/** Radiated power for 1 V at the feed: accepted power less wire and load losses. */
export const radiatedPower = (sol: Solution) => sol.p_in - sol.p_wire - sol.p_loads;

const intensity = (e: FarField) =>
	(e.e_theta.re ** 2 + e.e_theta.im ** 2 + e.e_phi.re ** 2 + e.e_phi.im ** 2) / (2 * ETA0);

/** Gain (ratio, not dB) towards (θ, φ) radians: 4πU/P_in. */
function gainAt(sol: Solution, theta: number, phi: number): number {
	return (4 * Math.PI * intensity(farField(sol, theta, phi))) / sol.p_in;
}

export interface Polarization {
	/** ≥ 1; null for purely linear polarization (an infinite ratio). */
	axial_ratio: number | null;
	axial_ratio_db: number | null;
	sense: 'RHCP' | 'LHCP' | 'linear';
	gain_rhcp_dbic: number;
	gain_lhcp_dbic: number;
}

/** Axial ratio and sense from E_θ, E_φ; `p_in` turns the circular parts into gains. */
export function polarization(e: FarField, p_in: number): Polarization {
	const { e_theta: t, e_phi: p } = e;
	const rr = (t.re - p.im) / Math.SQRT2,
		ri = (t.im + p.re) / Math.SQRT2;
	const lr = (t.re + p.im) / Math.SQRT2,
		li = (t.im - p.re) / Math.SQRT2;
	const r = Math.hypot(rr, ri);
	const l = Math.hypot(lr, li);
	const ar = (r + l) / Math.abs(r - l);
	const db = 20 * Math.log10(ar);
	const g = (m: number) => toDb((4 * Math.PI * (m * m)) / (2 * ETA0) / p_in);
	const finite = Number.isFinite(ar);
	return {
		axial_ratio: finite ? ar : null,
		axial_ratio_db: finite ? db : null,
		sense: !finite || db > 40 ? 'linear' : r > l ? 'RHCP' : 'LHCP',
		gain_rhcp_dbic: g(r),
		gain_lhcp_dbic: g(l)
	};
}

interface PatternCut {
	/** 'vertical': through the main beam and the z axis (the xz plane when the beam is along z); 'transverse': through the beam at right angles to it. */
	plane: 'vertical' | 'transverse';
	/** Unit vector of the direction at +90° in this cut (the beam is at 0°). */
	toward_90: [number, number, number];
	angles_deg: number[];
	gain_dbi: number[];
	/** Half-power beamwidth around the beam, null when the gain never falls 3 dB. */
	hpbw_deg: number | null;
}

export interface Radiation {
	p_in_w: number;
	p_rad_w: number;
	efficiency: number;
	beam: { theta_deg: number; phi_deg: number; gain_dbi: number; directivity_dbi: number };
	/** Gain towards the beam over gain straight opposite, dB; null when the opposite lies under a ground plane or has no field. */
	front_to_back_db: number | null;
	polarization: Polarization;
	cuts: PatternCut[];
}

function directionAngles(v: [number, number, number]): [number, number] {
	const th = Math.acos(Math.max(-1, Math.min(1, v[2])));
	return [th, Math.atan2(v[1], v[0])];
}

/** The direction of most gain: a 5° grid, then a pattern search down to 0.02°. */
function findBeam(sol: Solution): [number, number] {
	const top = sol.geometry.images ? 90 : 180;
	let best = -1;
	let th = 0;
	let ph = 0;
	for (let t = 0; t <= top; t += 5)
		for (let p = 0; p < 360; p += t === 0 || t === 180 ? 360 : 5) {
			const gv = gainAt(sol, t * DEG, p * DEG);
			if (gv > best) [best, th, ph] = [gv, t * DEG, p * DEG];
		}
	for (let step = 2.5 * DEG; step > 0.02 * DEG; step /= 2) {
		let moved = true;
		while (moved) {
			moved = false;
			for (const [dt, dp] of [
				[step, 0],
				[-step, 0],
				[0, step],
				[0, -step]
			]) {
				const t = Math.min(top * DEG, Math.max(0, th + dt));
				const gv = gainAt(sol, t, ph + dp);
				if (gv > best * (1 + 1e-12)) {
					[best, th, ph] = [gv, t, ph + dp];
					moved = true;
				}
			}
		}
	}
	return [th, ((ph % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI)];
}

function hpbw(angles: number[], gains: number[]): number | null {
	const mid = angles.indexOf(0);
	const half = gains[mid] / 2;
	const edge = (dir: 1 | -1): number | null => {
		for (let i = mid; i + dir >= 0 && i + dir < angles.length; i += dir)
			if (gains[i + dir] < half)
				return (
					angles[i] +
					((angles[i + dir] - angles[i]) * (gains[i] - half)) / (gains[i] - gains[i + dir])
				);
		return null;
	};
	const lo = edge(-1);
	const hi = edge(1);
	return lo === null || hi === null ? null : hi - lo;
}

/** Beam, gain, efficiency, front-to-back, polarization on the beam, and two cuts through it. */
export function radiation(sol: Solution, options: { step_deg?: number } = {}): Radiation {
	const step = options.step_deg ?? 1;
	const [bt, bp] = findBeam(sol);
	const f: [number, number, number] = [
		Math.sin(bt) * Math.cos(bp),
		Math.sin(bt) * Math.sin(bp),
		Math.cos(bt)
	];
	// vertical: the part of +z across the beam (x when the beam is along z); transverse: f × that
	let v1: [number, number, number] = [-f[2] * f[0], -f[2] * f[1], 1 - f[2] * f[2]];
	const n1 = Math.hypot(...v1);
	v1 = n1 < 1e-9 ? [1, 0, 0] : (v1.map((x) => x / n1) as [number, number, number]);
	const v2: [number, number, number] = [
		f[1] * v1[2] - f[2] * v1[1],
		f[2] * v1[0] - f[0] * v1[2],
		f[0] * v1[1] - f[1] * v1[0]
	];
	const cuts = (
		[
			['vertical', v1],
			['transverse', v2]
		] as const
	).map(([plane, v]) => {
		const angles_deg: number[] = [];
		const gains: number[] = [];
		for (let a = -180; a <= 180 + 1e-9; a += step) {
			const c = Math.cos(a * DEG),
				s = Math.sin(a * DEG);
			const [t, p] = directionAngles([
				f[0] * c + v[0] * s,
				f[1] * c + v[1] * s,
				f[2] * c + v[2] * s
			]);
			angles_deg.push(+a.toFixed(6));
			gains.push(gainAt(sol, t, p));
		}
		return {
			plane,
			toward_90: [...v] as [number, number, number],
			angles_deg,
			gain_dbi: gains.map(toDb),
			hpbw_deg: hpbw(angles_deg, gains)
		};
	});
	const beamField = farField(sol, bt, bp);
	const gBeam = (4 * Math.PI * intensity(beamField)) / sol.p_in;
	const [backT, backP] = directionAngles([-f[0], -f[1], -f[2]]);
	const gBack = sol.geometry.images && Math.cos(backT) < -1e-9 ? 0 : gainAt(sol, backT, backP);
	const p_rad = radiatedPower(sol);
	return {
		p_in_w: sol.p_in,
		p_rad_w: p_rad,
		efficiency: p_rad / sol.p_in,
		beam: {
			theta_deg: bt / DEG,
			phi_deg: bp / DEG,
			gain_dbi: toDb(gBeam),
			directivity_dbi: toDb((gBeam * sol.p_in) / p_rad)
		},
		front_to_back_db: gBack > 0 ? toDb(gBeam / gBack) : null,
		polarization: polarization(beamField, sol.p_in),
		cuts
	};
}
