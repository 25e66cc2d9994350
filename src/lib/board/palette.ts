// Board colours, taken from our Tailwind palette (tailwind.config.js) so the canvas and the UI
// agree; the canvas cannot read Tailwind classes, so the values live here once.
import type { Side } from '$lib/schemas/layout';
import type { Tone } from './types';

export const PALETTE = {
	felt50: '#f3f5f0',
	felt100: '#e3e8dc',
	felt200: '#c8d2bb',
	felt500: '#6f7f5c',
	felt700: '#45533a',
	felt900: '#232b1d',
	ink500: '#3d4450',
	ink700: '#262b33',
	ink900: '#14171c',
	brass300: '#f0d58a',
	brass500: '#c99a2e',
	brass700: '#8a6717',
	signal500: '#d9480f',
	signal700: '#a3360b',
	sidea: '#1f5fa8',
	sideb: '#b42318',
	// derived shades for terrain, chosen to read apart in bad light and in greyscale
	gridFaint: '#c8d2bbcc',
	gridStrong: '#6f7f5c',
	block: '#4f5a63',
	ruinFloor: '#c8d2bb99',
	impassable: '#9aa3ad',
	area: '#8fa37a66',
	ok: '#2f7a3a'
} as const;

export const SIDE_COLOUR: Record<Side, string> = { a: PALETTE.sidea, b: PALETTE.sideb };

const TONES: Record<Tone, string> = {
	signal: PALETTE.signal500,
	brass: PALETTE.brass700,
	sidea: PALETTE.sidea,
	sideb: PALETTE.sideb,
	ink: PALETTE.ink700,
	felt: PALETTE.felt700,
	ok: PALETTE.ok
};

/** A tone's colour as #rrggbb, so callers may append an alpha byte. */
export const toneColour = (tone: Tone): string => TONES[tone];
