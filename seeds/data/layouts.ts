// The demo's second table, invented for the demo: "Weirbank ford" on a 44 × 60 in table, a
// river across the middle (impassable) with two fords, a mill, hedges as area terrain, a
// ruined watchtower, three objectives and deployment zones on the long edges.
import { LAYOUT_SCHEMA_VERSION, type Layout } from '../../src/lib/schemas/layout';

export const SECOND_LAYOUT_NAME = 'Weirbank ford';

export function secondLayout(): Layout {
	return {
		schemaVersion: LAYOUT_SCHEMA_VERSION,
		name: SECOND_LAYOUT_NAME,
		board: { width: 44, depth: 60 },
		terrain: [
			// the river in three reaches: the gaps between them are the fords
			{ id: 'river-west', kind: 'impassable', name: 'River (west reach)', outline: [[0, 28], [10, 27.5], [10, 31.5], [0, 32]] },
			{ id: 'river-mid', kind: 'impassable', name: 'River (middle reach)', outline: [[14, 27.2], [29, 27.8], [29, 31.8], [14, 31.2]] },
			{ id: 'river-east', kind: 'impassable', name: 'River (east reach)', outline: [[33, 28], [44, 28.5], [44, 32.5], [33, 32]] },
			{ id: 'mill', kind: 'block', name: 'Weir mill', height: 3, outline: [[30, 20], [35, 20], [35, 24], [30, 24]] },
			{ id: 'hedge-north', kind: 'area', name: 'North hedges', outline: [[6, 18], [18, 18], [18, 19.5], [6, 19.5]] },
			{ id: 'hedge-south', kind: 'area', name: 'South hedges', outline: [[26, 40.5], [38, 40.5], [38, 42], [26, 42]] },
			{
				id: 'watchtower',
				kind: 'ruin',
				name: 'Fallen watchtower',
				outline: [[8, 38], [13, 38], [13, 43], [8, 43]],
				walls: [[[8, 43], [8, 38], [12, 38]]]
			}
		],
		objectives: [
			{ id: 'ford-west', x: 12, y: 29.5, name: 'West ford' },
			{ id: 'ford-east', x: 31, y: 30, name: 'East ford' },
			{ id: 'mill-race', x: 22, y: 22, name: 'Mill race' }
		],
		zones: [
			{ id: 'zone-a', side: 'a', name: 'Side A deploys here', outline: [[0, 0], [44, 0], [44, 10], [0, 10]] },
			{ id: 'zone-b', side: 'b', name: 'Side B deploys here', outline: [[0, 50], [44, 50], [44, 60], [0, 60]] }
		]
	};
}
