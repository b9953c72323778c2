import { FAMILIES, POLARIZATIONS } from '$lib/schemas/design';

export const familyLabel = (v: string) => FAMILIES.find((f) => f.value === v)?.label ?? v;
export const polarizationLabel = (v: string) =>
	POLARIZATIONS.find((p) => p.value === v)?.label ?? v;

export const STATE_LABELS: Record<string, string> = {
	draft: 'Draft',
	submitted: 'Awaiting review',
	approved: 'Approved',
	returned: 'Returned for revision',
	withdrawn: 'Withdrawn'
};

export function shortDate(iso: string | null): string {
	return iso ? iso.slice(0, 10) : '—';
}
