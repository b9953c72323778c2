import { describe, expect, it } from 'vitest';
import { seededRandom } from '../sweeps/synthetic';
import { buildGeometry } from './geometry';
import { evaluateModelTemplate, parseModel, parseModelTemplate } from './parse';

const valid = {
	ground: true,
	wires: [
		{ name: 'lead', from: [0.03, 0, 0], to: [0.03, 0, 0.005], radius: 0.001 },
		{
			kind: 'helix',
			name: 'coil',
			base: [0, 0, 0.005],
			axis: 'z',
			turns: 2,
			pitch: 0.03,
			helix_radius: 0.03,
			pieces_per_turn: 8,
			hand: 'right',
			radius: 0.001
		},
		{
			kind: 'arc',
			centre: [0, 0, 0.2],
			plane: 'xy',
			arc_radius: 0.05,
			start_deg: 0,
			end_deg: 360,
			pieces: 12,
			radius: 0.001
		},
		{
			kind: 'plate',
			shape: 'disc',
			centre: [0, 0, 0.3],
			plane: 'xy',
			diameter: 0.1,
			mesh: 0.03,
			radius: 0.0005
		},
		{ kind: 'wire', from: [0.2, 0, 0.1], to: [0.2, 0, 0.2], radius: 0.001, segments: 5 }
	],
	feed: { wire: 'lead', position: 0 },
	loads: [{ wire: 5, position: 0.4, arrangement: 'parallel', r_ohm: 100, c_f: 1e-12 }],
	conductivity_s_per_m: null
};

describe('parseModel', () => {
	it('reads a valid model; a missing kind means a straight wire', () => {
		const r = parseModel(valid);
		expect(r.ok && r.value.wires.map((w) => w.kind)).toEqual([
			'wire',
			'helix',
			'arc',
			'plate',
			'wire'
		]);
		expect(r.ok && buildGeometry(r.value, 1e9).ok).toBe(true);
	});

	it('names the wire and the field of the first problem', () => {
		const bad = (patch: (m: typeof valid & Record<string, unknown>) => void) => {
			const m = structuredClone(valid) as typeof valid & Record<string, unknown>;
			patch(m);
			const r = parseModel(m);
			if (r.ok) throw new Error('expected a failure');
			return r.error;
		};
		expect(bad((m) => ((m.wires[1] as Record<string, unknown>).turns = 'six'))).toEqual({
			message: 'helix 2 "coil", turns: must be a finite number',
			path: 'wires[1].turns',
			item: 1
		});
		expect(bad((m) => ((m.wires[0] as Record<string, unknown>).to = [0, 0]))).toMatchObject({
			message: 'wire 1 "lead", to: must be a list [x, y, z] of three values',
			path: 'wires[0].to'
		});
		expect(bad((m) => ((m.wires[4] as Record<string, unknown>).from = [0, 0, 'x']))).toMatchObject({
			message: 'wire 5, from z: must be a finite number',
			path: 'wires[4].from[2]'
		});
		expect(bad((m) => ((m.wires[2] as Record<string, unknown>).plane = 'xz'))).toMatchObject({
			message: 'arc 3, plane: must be one of "xy", "yz", "zx"'
		});
		expect(bad((m) => ((m.wires[3] as Record<string, unknown>).colour = 'red'))).toMatchObject({
			message: 'plate 4: unknown field "colour"'
		});
		expect(bad((m) => ((m.wires[0] as Record<string, unknown>).kind = 'spiral')).message).toBe(
			'wire 1 "lead": kind must be one of "wire", "arc", "helix", "plate"'
		);
		expect(bad((m) => (m.feed = { wire: 'lead' } as never)).message).toBe(
			'model, feed position: must be a finite number'
		);
		expect(bad((m) => (m.wires = [])).message).toBe('model, wires: must hold at least 1 entry');
		expect(bad((m) => (m.loads[0].arrangement = 'shunt')).path).toBe('loads[0].arrangement');
		expect(bad((m) => (m.loads = {} as never)).message).toBe('model, loads: must be a list');
		expect(parseModel('wires').ok).toBe(false);
		expect(parseModel(null).ok).toBe(false);
		expect(parseModel([valid]).ok).toBe(false);
	});

	it('does not let __proto__ or constructor through', () => {
		const r = parseModel(
			JSON.parse(
				'{"wires":[{"from":[0,0,0],"to":[0,0,1],"radius":0.001,"__proto__":{"polluted":1}}],"feed":{"wire":1,"position":0.5}}'
			)
		);
		expect(r.ok).toBe(false);
		expect(!r.ok && r.error.message).toMatch(/unknown field "__proto__"/);
		expect(({} as Record<string, unknown>).polluted).toBeUndefined();
	});

	it('fuzz: mutated JSON text and mutated values never throw; failures are located, successes build or refuse cleanly', () => {
		const rand = seededRandom(1505);
		const pick = (n: number) => Math.floor(rand() * n);
		const text = JSON.stringify(valid);
		const alphabet = '0123456789.-+eE ,:[]{}"xyzwirehelixarcplate_\\u';
		const oddValues: unknown[] = [
			null,
			-1,
			0,
			1e308,
			-1e-320,
			'NaN',
			'',
			'x'.repeat(5000),
			[],
			{},
			true,
			[1, 2, 3],
			1e6,
			0.5,
			2147483648
		];
		let parsed = 0;
		let built = 0;
		for (let k = 0; k < 1500; k++) {
			let input: unknown;
			if (k % 2 === 0) {
				// text mutations, as the sweep parser is fuzzed
				let t = text;
				for (let m = 1 + pick(4); m > 0; m--) {
					const at = pick(t.length + 1);
					const op = pick(3);
					const ch = alphabet[pick(alphabet.length)];
					if (op === 0) t = t.slice(0, at) + ch + t.slice(at);
					else if (op === 1) t = t.slice(0, at) + t.slice(at + 1 + pick(6));
					else t = t.slice(0, at) + ch + t.slice(at + 1);
				}
				try {
					input = JSON.parse(t);
				} catch {
					continue;
				}
			} else {
				// structural mutations: replace a random value somewhere in the tree
				const m = structuredClone(valid) as unknown;
				const slots: [Record<string, unknown> | unknown[], string | number][] = [];
				const walk = (v: unknown) => {
					if (Array.isArray(v)) v.forEach((x, i) => (slots.push([v, i]), walk(x)));
					else if (v && typeof v === 'object')
						for (const [kk, x] of Object.entries(v)) {
							slots.push([v as Record<string, unknown>, kk]);
							walk(x);
						}
				};
				walk(m);
				for (let n = 1 + pick(3); n > 0; n--) {
					const [obj, key] = slots[pick(slots.length)];
					(obj as Record<string | number, unknown>)[key] = oddValues[pick(oddValues.length)];
				}
				input = m;
			}
			parsed++;
			const r = parseModel(input);
			if (!r.ok) {
				expect(r.error.message.length).toBeGreaterThan(0);
				expect(r.error.message.length).toBeLessThan(400);
				expect(typeof r.error.path).toBe('string');
				continue;
			}
			const g = buildGeometry(r.value, 1e9);
			if (g.ok) {
				built++;
				expect(g.value.segments.n).toBeGreaterThan(0);
				expect(Array.from(g.value.segments.len).every((l) => l > 0 && Number.isFinite(l))).toBe(
					true
				);
			} else
				expect(g.error.message).toMatch(/^(wire|arc|helix|plate|feed|load|the model|conductivity)/);
		}
		expect(parsed).toBeGreaterThan(700);
		expect(built).toBeGreaterThan(20);
	});
});

describe('templates (formulas from the design file)', () => {
	const template = {
		wires: [
			{
				name: 'driven',
				from: [0, 0, '-len / 2'],
				to: [0, 0, 'len / 2'],
				radius: 'd / 2',
				segments: 11
			}
		],
		feed: { wire: 'driven', position: 0.5 }
	};
	const scope: Record<string, number> = { len: 0.14, d: 0.002 };
	// a stand-in for the formula engine: names from a table, one division
	const evaluate = (f: string) => {
		const m = /^(-?)(\w+)\s*\/\s*2$/.exec(f);
		if (!m || !(m[2] in scope)) return { error: `unknown name in "${f}"` };
		return ((m[1] ? -1 : 1) * scope[m[2]]) / 2;
	};

	it('evaluates every formula and keeps words (name, kind) as they are', () => {
		const t = parseModelTemplate(template);
		if (!t.ok) throw new Error(t.error.message);
		const m = evaluateModelTemplate(t.value, evaluate);
		expect(m.ok && m.value.wires[0]).toEqual({
			kind: 'wire',
			name: 'driven',
			from: [0, 0, -0.07],
			to: [0, 0, 0.07],
			radius: 0.001,
			segments: 11
		});
	});

	it('a failing formula names the wire and field', () => {
		const t = parseModelTemplate({
			...template,
			wires: [{ ...template.wires[0], to: [0, 0, 'length / 2'] }]
		});
		if (!t.ok) throw new Error(t.error.message);
		const m = evaluateModelTemplate(t.value, evaluate);
		expect(!m.ok && m.error).toEqual({
			message: 'wire 1 "driven", to z: unknown name in "length / 2"',
			path: 'wires[0].to[2]',
			item: 0
		});
		const nan = evaluateModelTemplate(t.value, () => NaN);
		expect(!nan.ok && nan.error.message).toBe(
			'wire 1 "driven", radius: the formula does not give a finite number'
		);
	});

	it('the number form refuses formula strings', () => {
		expect(parseModel(template).ok).toBe(false);
	});
});
