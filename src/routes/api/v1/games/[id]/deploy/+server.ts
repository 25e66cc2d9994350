// The deploying side puts pieces down: each wholly in one of its zones, none on another piece.
import { deploySchema } from '$lib/schemas/game';
import { deploy } from '$lib/board/play/rules';
import { gameActions } from '$lib/server/db/game-actions';
import { change } from '../../route-helpers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = (event) =>
	change(event, deploySchema, (id, user, body) => gameActions.act(id, user, body.seq, (ctx) => deploy(ctx, body.side, body.placements)));
