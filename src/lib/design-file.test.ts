import { describe, expect, it } from 'vitest';
import { parseDesignFile, writeDesignFile } from './design-file';
import type { DesignFile, DesignFileError } from './design-file';
import { FAMILIES, POLARIZATIONS } from './schemas/design';

// Fixture values are arbitrary test input (not check values); expectations are the schema's own rules.
const design: DesignFile = {
	title: 'Test biquad',
	slug: 'test-biquad',
	family: 'biquad',
	polarization: 'linear',
	summary: 'Fixture for the design-file tests.',
	design_frequency_hz: 2.45e9,
	parameters: [
		{ key: 'vf', label: 'Velocity factor', value: 0.95 },
		{ key: 'wire_d', label: 'Wire diameter', value: 1.628, unit: 'mm', valid_ratio: [0.005, 0.02] }
	],
	rows: [
		{
			key: 'side',
			label: 'Side of each square',
			formula: 'lambda / 4',
			kind: 'resonant',
			tolerance_mm: 0.3
		},
		{ key: 'gap', label: 'Reflector gap', formula: '0.12 * lambda', kind: 'structural' },
		{
			key: 'wire',
			label: 'Wire',
			formula: 'wire_d * 1 mm',
			kind: 'material',
			catalogue: 'awg',
			unit: 'mm'
		}
	],
	claim: {
		centre_hz: 2.45e9,
		band_lo_hz: 2.4e9,
		band_hi_hz: 2.5e9,
		vswr_max: 2,
		gain_dbi: 10.5,
		gain_verified: false
	},
	change_note: 'First revision: "quoted" text, colon: and # hash stay text.',
	notes: '# Build\n\n1. Bend the wire.\n2. Solder at the centre.\n'
};

function errorOf(text: string): DesignFileError {
	const result = parseDesignFile(text);
	if (result.ok) throw new Error('expected a parse error');
	return result.error;
}

const withFront = (yaml: string, notes = 'Notes.\n') => `---\n${yaml}\n---\n\n${notes}`;
const minimal = [
	'bandwright: 1',
	'title: T',
	'family: dipole',
	'polarization: linear',
	'summary: ""',
	'design_frequency: 868 MHz',
	'parameters: []',
	'rows:',
	'  - key: arm',
	'    label: Arm',
	'    formula: lambda / 4',
	'    kind: resonant',
	'claim: { centre_hz: 868000000, band_lo_hz: 863000000, band_hi_hz: 870000000, vswr_max: 2 }',
	'change_note: ""'
];

describe('design file round trip', () => {
	it('writes and reads back the same revision', () => {
		const text = writeDesignFile(design);
		expect(text.startsWith('---\nbandwright: 1\ntitle: Test biquad\n')).toBe(true);
		expect(parseDesignFile(text)).toEqual({ ok: true, value: design });
	});

	it('keeps notes that start with blank lines or are empty', () => {
		for (const notes of ['', '\n\nIndented start', 'No trailing newline']) {
			const result = parseDesignFile(writeDesignFile({ ...design, notes }));
			expect(result.ok && result.value.notes).toBe(notes);
		}
	});

	it('accepts design_frequency as text and CRLF line ends', () => {
		const result = parseDesignFile(withFront(minimal.join('\r\n')));
		expect(result.ok && result.value.design_frequency_hz).toBe(868e6);
		expect(result.ok && result.value.notes).toBe('Notes.\n');
	});
});

describe('design file errors', () => {
	it('names the field path and its line for a bad row', () => {
		const lines = minimal.map((l) => (l === '    kind: resonant' ? '    kind: springy' : l));
		const error = errorOf(withFront(lines.join('\n')));
		expect(error.field).toBe('rows[0].kind');
		// File line 1 is "---"; "kind:" is entry 12 of the front matter.
		expect(error.line).toBe(13);
		expect(error.message).toMatch(/^rows\[0\]\.kind: must be one of resonant/);
	});

	it('reports a missing required field by its path', () => {
		const error = errorOf(withFront(minimal.filter((l) => !l.startsWith('title')).join('\n')));
		expect(error.field).toBe('title');
		expect(error.message).toMatch(/is required/);
	});

	it('rejects a bad key and a reserved key', () => {
		const bad = minimal.map((l) => l.replace('key: arm', 'key: Arm-1'));
		expect(errorOf(withFront(bad.join('\n'))).field).toBe('rows[0].key');
		const reserved = minimal.map((l) => l.replace('key: arm', 'key: lambda'));
		expect(errorOf(withFront(reserved.join('\n'))).message).toMatch(/reserved/);
	});

	it('rejects a duplicated key across parameters and rows', () => {
		const dup = minimal.map((l) =>
			l === 'parameters: []' ? 'parameters: [{ key: arm, label: A, value: 1 }]' : l
		);
		const error = errorOf(withFront(dup.join('\n')));
		expect(error.field).toBe('rows[0].key');
		expect(error.message).toMatch(/used twice/);
	});

	it('rejects a claim whose centre lies outside its band', () => {
		const off = minimal.map((l) => l.replace('centre_hz: 868000000', 'centre_hz: 900000000'));
		expect(errorOf(withFront(off.join('\n'))).field).toBe('claim.centre_hz');
	});

	it('enforces the limits', () => {
		const long = minimal.map((l) => (l === 'title: T' ? `title: ${'x'.repeat(121)}` : l));
		expect(errorOf(withFront(long.join('\n'))).message).toMatch(/at most 120/);
		const formula = minimal.map((l) => l.replace('lambda / 4', 'x'.repeat(501)));
		expect(errorOf(withFront(formula.join('\n'))).field).toBe('rows[0].formula');
		const bigNotes = errorOf(withFront(minimal.join('\n'), 'n'.repeat(200 * 1024 + 1)));
		expect(bigNotes.field).toBe('notes');
	});

	it('rejects unknown fields, a notes field, and a bad frequency text', () => {
		expect(errorOf(withFront([...minimal, 'colour: red'].join('\n'))).field).toBe('colour');
		const typo = minimal.map((l) =>
			l.replace('kind: resonant', 'kind: resonant\n    tolerence_mm: 1')
		);
		expect(errorOf(withFront(typo.join('\n'))).message).toMatch(/^rows\[0\]: .*tolerence_mm/);
		expect(errorOf(withFront([...minimal, 'notes: hi'].join('\n'))).message).toMatch(
			/below the front matter/
		);
		const freq = minimal.map((l) => l.replace('868 MHz', '868 MHzz'));
		const error = errorOf(withFront(freq.join('\n')));
		expect([error.field, error.line]).toEqual(['design_frequency', 7]);
	});

	it('rejects a missing or wrong version', () => {
		expect(errorOf(withFront(minimal.slice(1).join('\n'))).field).toBe('bandwright');
		expect(errorOf(withFront(['bandwright: 2', ...minimal.slice(1)].join('\n'))).message).toMatch(
			/not supported/
		);
	});

	it('gives the file line of a YAML syntax error', () => {
		const broken = minimal.map((l) => (l === 'parameters: []' ? 'parameters: [' : l));
		const error = errorOf(withFront(broken.join('\n')));
		expect(error.message).toMatch(/^YAML syntax error/);
		// The unclosed "[" opens on front-matter line 7, file line 8; yaml reports where it noticed.
		expect(error.line).toBeGreaterThanOrEqual(8);
		const dupKey = errorOf(withFront(['bandwright: 1', 'title: A', 'title: B'].join('\n')));
		expect(dupKey.line).toBe(4);
	});

	it('needs the front-matter fences', () => {
		expect(errorOf('# just notes').line).toBe(1);
		expect(errorOf('---\ntitle: x\n').message).toMatch(/front-matter/);
		expect(errorOf('---\n- a\n- b\n---\n').message).toMatch(/field: value/);
	});
});

describe('enumerations', () => {
	it('carry the trade display labels', () => {
		const label = (v: string) => FAMILIES.find((f) => f.value === v)?.label;
		expect(label('yagi_uda')).toBe('Yagi–Uda');
		expect(label('waveguide_feed')).toBe('Cantenna / waveguide feed');
		expect(FAMILIES).toHaveLength(11);
		expect(POLARIZATIONS.map((p) => p.label)).toEqual(['Linear', 'LHCP', 'RHCP']);
	});
});
