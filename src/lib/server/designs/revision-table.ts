/** Maps a stored revision's content to the dimension engine's table definition. */
import type { RevisionContent } from '$lib/schemas/design';
import { isCatalogueId } from '$lib/rf/catalogues/stock';
import type { TableDefinition } from '$lib/rf/tables/types';

export function toTableDefinition(
	content: Pick<RevisionContent, 'parameters' | 'rows'>
): TableDefinition {
	return {
		parameters: content.parameters.map((p) => ({
			key: p.key,
			label: p.label,
			value: p.unit ? `${p.value} ${p.unit}` : p.value,
			valid_ratio: p.valid_ratio
				? { of: 'lambda', min: p.valid_ratio[0], max: p.valid_ratio[1] }
				: undefined
		})),
		rows: content.rows.map((r) => ({
			key: r.key,
			label: r.label,
			formula: r.formula,
			kind: r.kind,
			catalogue: r.catalogue && isCatalogueId(r.catalogue) ? r.catalogue : undefined,
			tolerance_mm: r.tolerance_mm,
			valid_ratio: r.valid_ratio
				? { of: 'lambda', min: r.valid_ratio[0], max: r.valid_ratio[1] }
				: undefined
		}))
	};
}

/** Catalogue names a row gives that the engine does not know (reported on the row by the caller). */
export function unknownCatalogues(
	content: Pick<RevisionContent, 'rows'>
): { key: string; catalogue: string }[] {
	return content.rows
		.filter((r) => r.catalogue && !isCatalogueId(r.catalogue))
		.map((r) => ({ key: r.key, catalogue: r.catalogue! }));
}
