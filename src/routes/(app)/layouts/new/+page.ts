// A new layout: an empty default table, or the demo table to start from (?start=demo).
import { emptyLayout } from '$lib/schemas/layout';
import { demoLayout } from '$lib/board/demo-layout';
import type { PageLoad } from './$types';

export const load: PageLoad = ({ url }) => ({
	initial: url.searchParams.get('start') === 'demo' ? { ...demoLayout(), name: 'Fennmoor crossroads (my copy)' } : emptyLayout()
});
