/** Gauss–Legendre rules on [0, 1] (nodes from Newton's iteration on Pₙ), cached by order. */

export interface Rule {
	t: Float64Array;
	w: Float64Array;
}

const cache = new Map<number, Rule>();

export function gaussLegendre(n: number): Rule {
	const hit = cache.get(n);
	if (hit) return hit;
	const t = new Float64Array(n);
	const w = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
		let dp = 1;
		for (let it = 0; it < 100; it++) {
			let p0 = 1;
			let p1 = x;
			for (let k = 2; k <= n; k++) {
				const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
				p0 = p1;
				p1 = p2;
			}
			dp = (n * (x * p1 - p0)) / (x * x - 1);
			const dx = p1 / dp;
			x -= dx;
			if (Math.abs(dx) < 1e-16) break;
		}
		t[i] = (1 - x) / 2;
		w[i] = 1 / ((1 - x * x) * dp * dp);
	}
	const rule = { t, w };
	cache.set(n, rule);
	return rule;
}

/**
 * A composite rule on [0, 1] graded geometrically towards t = 0 (panels [4⁻ⁱ⁻¹, 4⁻ⁱ] down to
 * `smallest`, then [0, smallest]), for integrands with a logarithmic peak at t = 0.
 */
export function gradedRule(smallest: number, perPanel = 6): Rule {
	const base = gaussLegendre(perPanel);
	const edges = [1];
	while (edges[edges.length - 1] > smallest && edges.length < 40)
		edges.push(edges[edges.length - 1] / 4);
	edges.push(0);
	const panels = edges.length - 1;
	const t = new Float64Array(panels * perPanel);
	const w = new Float64Array(panels * perPanel);
	let k = 0;
	for (let p = 0; p < panels; p++) {
		const hi = edges[p];
		const lo = edges[p + 1];
		for (let i = 0; i < perPanel; i++, k++) {
			t[k] = lo + (hi - lo) * base.t[i];
			w[k] = (hi - lo) * base.w[i];
		}
	}
	return { t, w };
}
