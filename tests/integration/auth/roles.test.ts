// Role checks on the server: admin pages answer 403 to a player (page and actions alike), and
// an admin can grant and revoke roles and read the outbox.
import { afterAll, describe, expect, it } from 'vitest';
import { Client, closeTestDb, freshEmail, testDb, waitForMail } from '../helpers';

const PASSWORD = 'long enough password';
afterAll(closeTestDb);

async function account(tag: string, roles: string[] = []) {
	const email = freshEmail(tag);
	const c = new Client();
	expect((await c.signUp(email, PASSWORD, `${tag} person`)).status).toBe(303);
	const user = await testDb()('users').whereRaw('lower(email) = lower(?)', [email]).first();
	for (const role of roles) await testDb()('user_roles').insert({ user_id: user.id, role });
	return { c, email, id: user.id as string };
}

const rolesOf = async (id: string) =>
	(await testDb()('user_roles').where({ user_id: id }).orderBy('role')).map((r: { role: string }) => r.role);

describe('admin pages', () => {
	it('answer 403 to a player, on the pages and on the actions', async () => {
		const player = await account('player');
		expect((await player.c.get('/admin/roles')).status).toBe(403);
		expect((await player.c.get('/admin/outbox')).status).toBe(403);
		const grab = await player.c.post('/admin/roles?/grant', { userId: player.id, role: 'admin' });
		expect(grab.status).toBe(403);
		expect(await rolesOf(player.id)).toEqual([]);
	});

	it('answer 403 to a judge or organiser too: only admin opens them', async () => {
		const judge = await account('judge', ['judge', 'organiser']);
		expect((await judge.c.get('/admin/roles')).status).toBe(403);
	});

	it('send a signed-out visitor to sign-in, and refuse a signed-out action', async () => {
		const res = await new Client().get('/admin/roles');
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/sign-in?next=%2Fadmin%2Froles');

		const target = await account('untouched');
		// A browser's form post refused with 401 is shown the sign-in page (the group's guard);
		// a script asking for JSON sees the 401 itself. Either way nothing changes.
		const browser = await new Client().post('/admin/roles?/grant', { userId: target.id, role: 'admin' });
		expect(browser.status).toBe(303);
		expect(browser.headers.get('location')).toMatch(/^\/sign-in\?next=/);
		const script = await new Client().post('/admin/roles?/grant', { userId: target.id, role: 'admin' }, { accept: 'application/json' });
		expect(script.status).toBe(401);
		expect(await script.json()).toEqual({ type: 'error', error: { message: 'Sign in first' } });
		expect(await rolesOf(target.id)).toEqual([]);
	});

	it('let an admin list accounts, grant and revoke roles', async () => {
		const admin = await account('admin', ['admin']);
		const target = await account('target');
		const page = await admin.c.get('/admin/roles');
		expect(page.status).toBe(200);
		expect(await page.text()).toContain(target.email);

		expect((await admin.c.post('/admin/roles?/grant', { userId: target.id, role: 'judge' })).status).toBe(200);
		expect(await rolesOf(target.id)).toEqual(['judge']);
		// The new role counts on the target's very next request.
		expect((await target.c.get('/admin/roles')).status).toBe(403);
		await admin.c.post('/admin/roles?/grant', { userId: target.id, role: 'admin' });
		expect((await target.c.get('/admin/roles')).status).toBe(200);

		expect((await admin.c.post('/admin/roles?/revoke', { userId: target.id, role: 'admin' })).status).toBe(200);
		expect(await rolesOf(target.id)).toEqual(['judge']);
		expect((await target.c.get('/admin/roles')).status).toBe(403);
	});

	it('refuse unknown roles and accounts, and an admin dropping their own admin role', async () => {
		const admin = await account('admin2', ['admin']);
		expect((await admin.c.post('/admin/roles?/grant', { userId: admin.id, role: 'overlord' })).status).toBe(400);
		expect((await admin.c.post('/admin/roles?/grant', { userId: 'no-such-id', role: 'judge' })).status).toBe(400);
		expect((await admin.c.post('/admin/roles?/revoke', { userId: admin.id, role: 'admin' })).status).toBe(400);
		expect(await rolesOf(admin.id)).toEqual(['admin']);
	});

	it('show an admin the outbox of the fake mail server', async () => {
		const admin = await account('outbox', ['admin']);
		await new Client().post('/forgot-password', { email: admin.email });
		await waitForMail(admin.email);
		const res = await admin.c.get('/admin/outbox');
		expect(res.status).toBe(200);
		const html = await res.text();
		expect(html).toContain('Reset your Inchwarden password');
		expect(html).toContain(admin.email);
	});
});

describe('the session API', () => {
	it('answers 401 signed out and the user with roles signed in', async () => {
		expect((await new Client().get('/api/v1/session')).status).toBe(401);
		const judge = await account('apijudge', ['judge']);
		const res = await judge.c.get('/api/v1/session');
		expect(res.status).toBe(200);
		expect((await res.json()).user).toMatchObject({ id: judge.id, email: judge.email, roles: ['player', 'judge'] });
		expect((await judge.c.send('DELETE', '/api/v1/session')).status).toBe(204);
		expect((await judge.c.get('/api/v1/session')).status).toBe(401);
	});
});
