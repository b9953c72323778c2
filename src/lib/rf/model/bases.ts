/**
 * The unknowns of the moment method on a segmented model: one triangle (piecewise-linear) current
 * per interior node, k − 1 at a junction of k segment ends (each pairing the first end with
 * another, so the currents there always sum to zero), and one half triangle per segment end on
 * the ground plane (its image completes it). Stored per segment (CSR): each piece of a basis on a
 * segment has its basis, sign σ and value α + βt along the segment.
 */
export interface Bases {
	count: number;
	/** The node of each basis and the segment ends (2·segment + 0|1) it flows into and out of (−1: ground). */
	at: { node: number; into: number; out: number }[];
	pieceStart: Int32Array;
	basisOf: Int32Array;
	sigma: Float64Array;
	alpha: Float64Array;
	beta: Float64Array;
}

export function buildBases(
	node0: Int32Array,
	node1: Int32Array,
	nodes: number,
	grounded: Uint8Array
): Bases {
	const total = node0.length;
	const attached: number[][] = Array.from({ length: nodes }, () => []);
	for (let k = 0; k < total; k++) {
		attached[node0[k]].push(2 * k);
		attached[node1[k]].push(2 * k + 1);
	}
	const items: { seg: number; basis: number; sigma: number; alpha: number; beta: number }[] = [];
	// A segment end: into the node is +u at the end (t = 1, value t) and −u at the start (value 1 − t).
	const piece = (end: number, basis: number, into: boolean) => {
		const seg = end >> 1;
		const atEnd = (end & 1) === 1;
		items.push({
			seg,
			basis,
			sigma: (atEnd ? 1 : -1) * (into ? 1 : -1),
			alpha: atEnd ? 0 : 1,
			beta: atEnd ? 1 : -1
		});
	};
	let bases = 0;
	const at: { node: number; into: number; out: number }[] = [];
	for (let v = 0; v < nodes; v++) {
		const list = attached[v];
		if (grounded[v]) {
			for (const e of list) {
				piece(e, bases, true);
				at.push({ node: v, into: e, out: -1 });
				bases++;
			}
		} else {
			for (let i = 1; i < list.length; i++) {
				piece(list[0], bases, true);
				piece(list[i], bases, false);
				at.push({ node: v, into: list[0], out: list[i] });
				bases++;
			}
		}
	}
	items.sort((a, b) => a.seg - b.seg);
	const pieceStart = new Int32Array(total + 1);
	for (const it of items) pieceStart[it.seg + 1]++;
	for (let k = 0; k < total; k++) pieceStart[k + 1] += pieceStart[k];

	return {
		count: bases,
		at,
		pieceStart,
		basisOf: Int32Array.from(items, (x) => x.basis),
		sigma: Float64Array.from(items, (x) => x.sigma),
		alpha: Float64Array.from(items, (x) => x.alpha),
		beta: Float64Array.from(items, (x) => x.beta)
	};
}
