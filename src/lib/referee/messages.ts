// Plain sentences for findings: measured figures to two decimals, limits as the profile says them.
export function inches(x: number): string {
	return x.toFixed(2);
}

/** A limit as written in the profile ("1", "2.5"), never more than two decimals. */
export function limitText(x: number): string {
	return String(Number(x.toFixed(2)));
}

export function classList(classes: readonly string[]): string {
	if (classes.length === 0) return 'no class';
	if (classes.length === 1) return classes[0];
	return `${classes.slice(0, -1).join(', ')} and ${classes[classes.length - 1]}`;
}

export function ordinal(k: number): string {
	return k === 1 ? 'nearest' : k === 2 ? 'second-nearest' : k === 3 ? 'third-nearest' : `${k}th-nearest`;
}

export function countWord(k: number): string {
	return ['none', 'one', 'two', 'three', 'four', 'five'][k] ?? String(k);
}
