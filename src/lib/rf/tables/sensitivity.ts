/**
 * First-order sensitivity of a resonant dimension. A dimension proportional to wavelength moves the
 * resonance by Δf/f ≈ −ΔL/L; every figure here is that first-order estimate and says so.
 */
export interface Sensitivity {
	/** Resonance shift in Hz when the dimension grows by 0.1 mm (negative: longer is lower). */
	hz_per_0_1mm: number;
	/** ± build tolerance in mm that keeps the resonance inside the band (when a band is given). */
	tolerance_mm?: number;
	first_order: true;
}

/** Δf = −f · ΔL / L, all in SI units. */
export function resonanceShiftHz(fHz: number, lengthM: number, deltaM: number): number {
	return (-fHz * deltaM) / lengthM;
}

/**
 * Symmetric tolerance: L × min(f_hi − f, f − f_lo) / f. A longer part lowers the resonance toward
 * f_lo and a shorter one raises it toward f_hi; a builder cuts to ± one figure, so the tighter side
 * decides. Zero when f lies outside the band.
 */
export function bandToleranceM(
	fHz: number,
	lengthM: number,
	band: readonly [number, number]
): number {
	const [lo, hi] = band;
	const room = Math.min(hi - fHz, fHz - lo);
	return room > 0 ? (Math.abs(lengthM) * room) / fHz : 0;
}

export function sensitivityFor(
	fHz: number,
	lengthM: number,
	band?: readonly [number, number]
): Sensitivity {
	const s: Sensitivity = {
		hz_per_0_1mm: resonanceShiftHz(fHz, lengthM, 1e-4),
		first_order: true
	};
	if (band) s.tolerance_mm = bandToleranceM(fHz, lengthM, band) * 1000;
	return s;
}
