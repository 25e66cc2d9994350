// The club and the signed-in user's role in it, for every club page and action: strangers get
// 403 (the page lists people), a club that does not exist 404.
import { error } from '@sveltejs/kit';
import type { User } from 'lucia';
import { clubs, type Club } from '$lib/server/db/clubs';
import type { ClubRole } from '$lib/schemas/club';

export async function clubFor(param: string, user: User): Promise<{ club: Club; role: ClubRole }> {
	const id = Number(param);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such club');
	const club = await clubs.find(id);
	if (!club) error(404, 'No such club');
	const role = await clubs.roleOf(id, user.id);
	if (!role) error(403, "This club's pages are for its members");
	return { club, role };
}
