/**
 * The one declaration of each family function a formula may call: its name, arguments with their
 * kind of quantity, its result, where the formula comes from, and one worked example with the value
 * its source gives. The compiler's allow-list (functions.ts), the mathjs reference the tests compare
 * against (sandbox.ts), the formula guide and the editor's help are all made from this list, so a
 * new function is one entry here.
 */
import * as fam from './families';

/** The kind of quantity an argument or result is, in SI: Hz, m, or a plain number. */
export type Quantity = 'frequency' | 'length' | 'number';

interface FunctionArg {
	name: string;
	quantity: Quantity;
	about: string;
	/** Optional arguments come last and take this value when left out. */
	default?: number;
}

interface FunctionExample {
	/** A formula to type, as the guide shows it. */
	formula: string;
	/** The target frequency the example is read at, when it uses f. */
	at_hz?: number;
	/** The expected value in `unit` (mm for lengths, GHz for frequencies, plain otherwise). */
	value: number;
	unit: 'mm' | 'GHz' | '';
	/** Relative tolerance of the source's printed figure. */
	tolerance: number;
	/** Where the expected value comes from (book and equation, or [calc] with the formula). */
	source: string;
}

export interface FunctionDeclaration {
	name: string;
	family: 'patch' | 'waveguide' | 'lines';
	summary: string;
	args: FunctionArg[];
	result: Quantity;
	/** On plain SI numbers; NaN means outside the function's domain. */
	impl: (...xs: number[]) => number;
	/** What a NaN result means, as the row's error says it. */
	domain?: string;
	source: string;
	example: FunctionExample;
}

export const FAMILIES: Record<FunctionDeclaration['family'], { title: string; intro: string }> = {
	patch: {
		title: 'Microstrip patch (transmission-line model, Balanis, Antenna Theory, §14.2)',
		intro:
			"The examples use Balanis's Example 14.1 at 10 GHz: εr = 2.2, h = 1.588 mm. The book takes c = 3 × 10⁸ m/s; the engine uses the exact speed of light, hence small differences in the last digit."
	},
	waveguide: {
		title: 'Circular waveguide (Pozar, Microwave Engineering, §3.4)',
		intro:
			'd is the inner diameter; the optional last argument is the relative permittivity of a filling (1, air, when left out).'
	},
	lines: {
		title: 'Lines, baluns and matching',
		intro:
			'The matching functions take and give plain numbers (dB values are plain numbers), so they are used inside other formulas or as ratio rows.'
	}
};

const er = (about = 'relative permittivity of the filling'): FunctionArg => ({
	name: 'er',
	quantity: 'number',
	about,
	default: 1
});

export const DECLARATIONS: readonly FunctionDeclaration[] = [
	{
		name: 'patch_width',
		family: 'patch',
		summary: 'width W = c/(2f) · √(2/(εr+1))',
		args: [
			{ name: 'f', quantity: 'frequency', about: 'resonant frequency' },
			{ name: 'er', quantity: 'number', about: 'substrate relative permittivity' }
		],
		result: 'length',
		impl: (f, e) => fam.patchWidth(f, e),
		source: 'Balanis, Antenna Theory, 3rd ed., §14.2, eq. 14-6',
		example: {
			formula: 'patch_width(f, 2.2)',
			at_hz: 10e9,
			value: 11.85,
			unit: 'mm',
			tolerance: 1e-3,
			source: 'Balanis 3rd ed. Example 14.1: W = 1.186 cm (c = 3e8); 1.18503 cm with exact c [calc]'
		}
	},
	{
		name: 'patch_eeff',
		family: 'patch',
		summary: 'effective permittivity of a microstrip of width w on height h',
		args: [
			{ name: 'er', quantity: 'number', about: 'substrate relative permittivity' },
			{ name: 'h', quantity: 'length', about: 'substrate height' },
			{ name: 'w', quantity: 'length', about: 'strip (patch) width' }
		],
		result: 'number',
		impl: fam.patchEeff,
		source: 'Balanis, Antenna Theory, 3rd ed., §14.2, eq. 14-1',
		example: {
			formula: 'patch_eeff(2.2, 1.588 mm, 11.86 mm)',
			value: 1.972,
			unit: '',
			tolerance: 1e-3,
			source: 'Balanis 3rd ed. Example 14.1: εreff = 1.972 for W = 1.186 cm'
		}
	},
	{
		name: 'patch_dl',
		family: 'patch',
		summary: 'length extension ΔL at each radiating edge (Hammerstad)',
		args: [
			{ name: 'h', quantity: 'length', about: 'substrate height' },
			{ name: 'w', quantity: 'length', about: 'patch width' },
			{ name: 'eeff', quantity: 'number', about: 'effective permittivity' }
		],
		result: 'length',
		impl: fam.patchDeltaL,
		source: 'Balanis, Antenna Theory, 3rd ed., §14.2, eq. 14-2',
		example: {
			formula: 'patch_dl(1.588 mm, 11.86 mm, 1.972)',
			value: 0.811,
			unit: 'mm',
			tolerance: 2e-3,
			source: 'Balanis 3rd ed. Example 14.1: ΔL = 0.081 cm (0.081107 cm [calc])'
		}
	},
	{
		name: 'patch_length',
		family: 'patch',
		summary: 'resonant length L = c/(2f√εreff) − 2ΔL, with W from patch_width',
		args: [
			{ name: 'f', quantity: 'frequency', about: 'resonant frequency' },
			{ name: 'er', quantity: 'number', about: 'substrate relative permittivity' },
			{ name: 'h', quantity: 'length', about: 'substrate height' }
		],
		result: 'length',
		impl: (f, e, h) => fam.patchLength(f, e, h),
		source: 'Balanis, Antenna Theory, 3rd ed., §14.2, eq. 14-7',
		example: {
			formula: 'patch_length(f, 2.2, 1.588 mm)',
			at_hz: 10e9,
			value: 9.053,
			unit: 'mm',
			tolerance: 1e-3,
			source: 'Balanis 3rd ed. Example 14.1: L = 0.906 cm (c = 3e8); 0.90534 cm with exact c [calc]'
		}
	},
	{
		name: 'te11_cutoff',
		family: 'waveguide',
		summary: 'cutoff frequency of the TE11 mode (the one a probe feed uses)',
		args: [{ name: 'd', quantity: 'length', about: 'inner diameter' }, er()],
		result: 'frequency',
		impl: fam.te11Cutoff,
		domain: 'diameter must be positive',
		source: "Pozar, Microwave Engineering, 4th ed., §3.4: fc = p'11 c / (2π a √εr)",
		example: {
			formula: 'te11_cutoff(10 mm, 2.08)',
			value: 12.18,
			unit: 'GHz',
			tolerance: 1e-3,
			source:
				"[calc] 1.841184 × c / (π × 10 mm × √2.08) = 12.18 GHz (Pozar §3.4, p'11 from A&S Table 9.5)"
		}
	},
	{
		name: 'tm01_cutoff',
		family: 'waveguide',
		summary: 'cutoff frequency of the TM01 mode, the next one up',
		args: [{ name: 'd', quantity: 'length', about: 'inner diameter' }, er()],
		result: 'frequency',
		impl: fam.tm01Cutoff,
		domain: 'diameter must be positive',
		source: 'Pozar, Microwave Engineering, 4th ed., §3.4: fc = p01 c / (2π a √εr)',
		example: {
			formula: 'tm01_cutoff(10 mm)',
			value: 22.949,
			unit: 'GHz',
			tolerance: 1e-4,
			source: '[calc] 2.404826 × c / (π × 10 mm) = 22.949 GHz (Pozar §3.4, p01 from A&S Table 9.5)'
		}
	},
	{
		name: 'guide_wavelength',
		family: 'waveguide',
		summary: 'TE11 guide wavelength λg = λ / √(1 − (fc/f)²); an error at or below cutoff',
		args: [
			{ name: 'f', quantity: 'frequency', about: 'operating frequency' },
			{ name: 'd', quantity: 'length', about: 'inner diameter' },
			er()
		],
		result: 'length',
		impl: fam.guideWavelength,
		domain: 'the frequency is at or below the TE11 cutoff of this diameter',
		source: 'Pozar, Microwave Engineering, 4th ed., §3.4: λg = λ / √(1 − (fc/f)²), λ = c/(f√εr)',
		example: {
			formula: 'guide_wavelength(14 GHz, 10 mm, 2.08)',
			value: 30.13,
			unit: 'mm',
			tolerance: 1e-3,
			source: '[calc] PTFE εr = 2.08, a = 0.5 cm, 14 GHz: λg = 30.13 mm (Pozar §3.4 relations)'
		}
	},
	{
		name: 'vf_from_er',
		family: 'lines',
		summary: 'velocity factor 1/√εr of a line with that dielectric',
		args: [{ name: 'er', quantity: 'number', about: 'dielectric relative permittivity' }],
		result: 'number',
		impl: fam.vfFromEr,
		domain: 'er must be positive',
		source: 'Pozar, Microwave Engineering, 4th ed., ch. 2: VF = 1/√εr for a TEM line (from memory)',
		example: {
			formula: 'vf_from_er(2.25)',
			value: 0.6667,
			unit: '',
			tolerance: 1e-4,
			source: '[calc] 1/√2.25 = 2/3 (solid PE, εr 2.25)'
		}
	},
	{
		name: 'lambda_in',
		family: 'lines',
		summary: 'wavelength on a line with velocity factor vf',
		args: [
			{ name: 'f', quantity: 'frequency', about: 'frequency' },
			{ name: 'vf', quantity: 'number', about: 'velocity factor' }
		],
		result: 'length',
		impl: fam.lambdaIn,
		source: 'λ = vf · c / f (definition of the velocity factor)',
		example: {
			formula: 'lambda_in(f, 0.66)',
			at_hz: 2.45e9,
			value: 80.76,
			unit: 'mm',
			tolerance: 1e-4,
			source: '[calc] 0.66 × 299 792 458 / 2.45e9 m = 80.76 mm'
		}
	},
	{
		name: 'gamma_from_vswr',
		family: 'lines',
		summary: 'magnitude of the reflection coefficient for a VSWR',
		args: [{ name: 'v', quantity: 'number', about: 'VSWR' }],
		result: 'number',
		impl: fam.gammaFromVswr,
		domain: 'VSWR must be ≥ 1',
		source: 'Pozar, Microwave Engineering, 4th ed., §2.3: |Γ| = (VSWR − 1)/(VSWR + 1)',
		example: {
			formula: 'gamma_from_vswr(2)',
			value: 0.33333,
			unit: '',
			tolerance: 1e-4,
			source: '[calc] (2 − 1)/(2 + 1) = 1/3 (Pozar §2.3)'
		}
	},
	{
		name: 'rl_from_vswr',
		family: 'lines',
		summary: 'return loss in dB for a VSWR',
		args: [{ name: 'v', quantity: 'number', about: 'VSWR' }],
		result: 'number',
		impl: fam.rlFromVswr,
		domain: 'VSWR must be ≥ 1',
		source: 'Pozar, Microwave Engineering, 4th ed., §2.3: RL = −20 log10|Γ|',
		example: {
			formula: 'rl_from_vswr(2)',
			value: 9.542,
			unit: '',
			tolerance: 1e-4,
			source: '[calc] −20 log10(1/3) = 9.542 dB (Pozar §2.3)'
		}
	},
	{
		name: 'vswr_from_rl',
		family: 'lines',
		summary: 'VSWR for a return loss in dB',
		args: [{ name: 'rl', quantity: 'number', about: 'return loss in dB' }],
		result: 'number',
		impl: fam.vswrFromRl,
		domain: 'return loss must be ≥ 0 dB',
		source: 'Pozar, Microwave Engineering, 4th ed., §2.3 (the relations above, inverted)',
		example: {
			formula: 'vswr_from_rl(13.979)',
			value: 1.5,
			unit: '',
			tolerance: 1e-4,
			source: '[calc] |Γ| = 10^(−13.979/20) = 0.2, VSWR = 1.2/0.8 = 1.5 (Pozar §2.3)'
		}
	},
	{
		name: 'mismatch_loss',
		family: 'lines',
		summary: 'mismatch loss in dB for a VSWR',
		args: [{ name: 'v', quantity: 'number', about: 'VSWR' }],
		result: 'number',
		impl: fam.mismatchLoss,
		domain: 'VSWR must be ≥ 1',
		source: 'Pozar, Microwave Engineering, 4th ed., §2.3: ML = −10 log10(1 − |Γ|²)',
		example: {
			formula: 'mismatch_loss(2)',
			value: 0.5115,
			unit: '',
			tolerance: 1e-4,
			source: '[calc] −10 log10(1 − 1/9) = 0.5115 dB (Pozar §2.3)'
		}
	}
];

/** How a person writes the call: `te11_cutoff(d, er?)`. */
export function signature(d: FunctionDeclaration): string {
	return `${d.name}(${d.args.map((a) => (a.default === undefined ? a.name : `${a.name}?`)).join(', ')})`;
}

/** Argument kinds in words: `d length, er number (default 1)`. */
export function argumentsText(d: FunctionDeclaration): string {
	return d.args
		.map(
			(a) => `${a.name}: ${a.quantity}${a.default === undefined ? '' : ` (default ${a.default})`}`
		)
		.join(', ');
}
