// Clubs and their members.
import { use, type Db } from './index';

export interface ClubSummary {
	id: number;
	name: string;
	town: string;
	role: 'member' | 'organiser';
	members: number;
}

/** The clubs a user belongs to, with the user's role in each and the member count. */
export async function listForUser(userId: string, trx?: Db): Promise<ClubSummary[]> {
	const rows = await use(trx)('clubs as c')
		.join('club_members as m', 'm.club_id', 'c.id')
		.where('m.user_id', userId)
		.select(
			'c.id',
			'c.name',
			'c.town',
			'm.role',
			use(trx).raw('(select count(*) from club_members cm where cm.club_id = c.id)::int as members')
		)
		.orderBy('c.name');
	return rows as ClubSummary[];
}

export const clubs = { listForUser };
