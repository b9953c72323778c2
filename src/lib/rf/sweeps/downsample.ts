/**
 * Min/max bucket downsampling for display: the first and last points, then for each bucket of
 * the interior its lowest and highest value in index order. The global minimum and maximum
 * always survive, so a plotted VSWR dip is never lost. Returns ascending indices, at most maxPoints.
 */
export function downsampleMinMax(values: ArrayLike<number>, maxPoints = 2000): number[] {
	const n = values.length;
	if (!(maxPoints >= 4)) throw new RangeError('maxPoints must be at least 4');
	if (n <= maxPoints) return Array.from({ length: n }, (_, i) => i);
	const interior = n - 2;
	const buckets = Math.floor((maxPoints - 2) / 2);
	const out: number[] = [0];
	for (let k = 0; k < buckets; k++) {
		const s = 1 + Math.floor((k * interior) / buckets);
		const e = 1 + Math.floor(((k + 1) * interior) / buckets);
		if (e <= s) continue;
		let iMin = s;
		let iMax = s;
		for (let i = s + 1; i < e; i++) {
			if (values[i] < values[iMin]) iMin = i;
			if (values[i] > values[iMax]) iMax = i;
		}
		if (iMin === iMax) out.push(iMin);
		else if (iMin < iMax) out.push(iMin, iMax);
		else out.push(iMax, iMin);
	}
	out.push(n - 1);
	return out;
}
