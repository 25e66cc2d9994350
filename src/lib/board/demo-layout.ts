// The demo table, invented for the demo: "Fennmoor crossroads" on a 44 × 60 in table, with
// three blocks, a ruined chapel with walls, a mill pond (impassable), a wood (area terrain),
// four objectives and a deployment zone for each side. Seeds and tests use it.
import { LAYOUT_SCHEMA_VERSION, type Layout } from '../schemas/layout';

export const DEMO_LAYOUT_NAME = 'Fennmoor crossroads';

export function demoLayout(): Layout {
	return {
		schemaVersion: LAYOUT_SCHEMA_VERSION,
		name: DEMO_LAYOUT_NAME,
		board: { width: 44, depth: 60 },
		terrain: [
			{ id: 'granary', kind: 'block', name: 'Granary', height: 3, outline: [[6, 16], [12, 16], [12, 20], [6, 20]] },
			{ id: 'toll-house', kind: 'block', name: 'Toll house', height: 2, outline: [[31, 39], [35, 39], [35, 43], [31, 43]] },
			// a long barn set at 30° to the road
			{
				id: 'stone-barn',
				kind: 'block',
				name: 'Stone barn',
				height: 2.5,
				outline: [[30.5, 14.134], [34.83, 16.634], [33.33, 19.232], [29, 16.732]]
			},
			{
				id: 'chapel',
				kind: 'ruin',
				name: 'Old chapel',
				outline: [[18, 27], [26, 27], [26, 33], [18, 33]],
				// two walls meeting at the north-west corner, a doorway gap on the east side
				walls: [
					[[18, 33], [18, 27], [23, 27]],
					[[26, 29], [26, 33], [22, 33]]
				]
			},
			{
				id: 'mill-pond',
				kind: 'impassable',
				name: 'Mill pond',
				outline: [[7, 40], [10, 38.5], [13.5, 39.5], [14.5, 42.5], [12.5, 45.5], [8.5, 45.5], [6, 43]]
			},
			{
				id: 'alder-wood',
				kind: 'area',
				name: 'Alder wood',
				outline: [[30, 25], [35, 23], [39, 25.5], [39.5, 30], [36, 33.5], [31, 32.5], [29, 28.5]]
			}
		],
		objectives: [
			{ id: 'obj-north', x: 22, y: 20, name: 'N' },
			{ id: 'obj-south', x: 22, y: 40, name: 'S' },
			{ id: 'obj-west', x: 8, y: 30, name: 'W' },
			{ id: 'obj-east', x: 38, y: 38, name: 'E' }
		],
		zones: [
			{ id: 'zone-a', side: 'a', name: 'Side A deploys here', outline: [[0, 0], [44, 0], [44, 12], [0, 12]] },
			{ id: 'zone-b', side: 'b', name: 'Side B deploys here', outline: [[0, 48], [44, 48], [44, 60], [0, 60]] }
		]
	};
}
