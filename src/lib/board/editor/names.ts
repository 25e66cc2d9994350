// Names the editor gives things: a copy's name, and how an item is called in the side panel.
import type { LayoutObjective, LayoutTerrain, Zone } from '$lib/schemas/layout';

/** "Fennmoor crossroads" → "Fennmoor crossroads (copy)", kept within the 100-character limit. */
export function copyName(name: string): string {
	const suffix = ' (copy)';
	return name.slice(0, 100 - suffix.length).trimEnd() + suffix;
}

const KIND_WORD: Record<LayoutTerrain['kind'], string> = {
	block: 'Block',
	ruin: 'Ruin',
	impassable: 'Impassable',
	area: 'Area terrain'
};

export function itemTitle(item: LayoutTerrain | LayoutObjective | Zone): string {
	if ('kind' in item) return item.name ? `${KIND_WORD[item.kind]} “${item.name}”` : KIND_WORD[item.kind];
	if ('side' in item) return item.name ? `Zone “${item.name}”` : `Deployment zone, side ${item.side.toUpperCase()}`;
	return item.name ? `Objective “${item.name}”` : 'Objective';
}
