// A saved layout to snapshot into a new game. The layouts table arrives with the board editor;
// until its entity module lands, games are created from a layout document only.
import type { Layout } from '$lib/schemas/layout';

export async function savedLayout(id: number): Promise<Layout | null> {
	void id;
	return null;
}
