// A saved layout to snapshot into a new game (any signed-in user may reuse a saved layout).
import type { Layout } from '$lib/schemas/layout';
import { layouts } from '$lib/server/db/layouts';

export async function savedLayout(id: number): Promise<Layout | null> {
	return (await layouts.find(id))?.doc ?? null;
}
