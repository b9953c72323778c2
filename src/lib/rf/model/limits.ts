import { C } from '../units/constants';

/** Segments in one discretised model, all wires together. The fill is O(N²) and the LU O(N³). */
export const MAX_SEGMENTS = 600;
/** Straight wires after arcs, helices and plates are expanded into pieces. */
export const MAX_WIRES = 600;
/** Items in a model's `wires` list before expansion, and loads. */
export const MAX_ITEMS = 200;
export const MAX_LOADS = 50;
/** Characters in a wire name, and in a formula when the model is a template. */
export const MAX_NAME_CHARS = 60;
export const MAX_FORMULA_CHARS = 500;
/** No coordinate may lie farther than this from the origin, metres. */
export const MAX_EXTENT_M = 1e4;
/** Thinner than this is not a wire any builder can hold, metres. */
export const MIN_RADIUS_M = 1e-7;
/** Frequencies a sweep may cover: from this up to the frequency limit of every input (units/frequency). */
export const MIN_FREQUENCY_HZ = 1e3;
/** Output points of one predicted sweep. */
export const MAX_SWEEP_POINTS = 2001;
/** Direct solves one sweep may spend on samples and on checking its fit. */
export const MAX_DIRECT_SOLVES = 129;

/** Default segment rule: no segment longer than λ/20 at the top of the band… */
export const SEGMENTS_PER_WAVELENGTH = 20;
/** …nor shorter than this many wire radii (the thin-wire kernel needs length ≫ radius). */
export const MIN_SEGMENT_RADII = 4;

/** Vacuum permeability, H/m (CODATA 2018 recommended value [CODATA2018]). */
export const MU0 = 1.25663706212e-6;
/** Wave impedance of free space, Ω: η0 = μ0·c. */
export const ETA0 = MU0 * C;
/** Annealed copper, S/m (IEC 60028: 100 % IACS = 58.0 MS/m at 20 °C [IEC60028]). */
export const COPPER_S_PER_M = 5.8e7;

export { C };
