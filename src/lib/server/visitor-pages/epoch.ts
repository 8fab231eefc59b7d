// The content epoch: one number in PostgreSQL that triggers raise with every committed change to what visitor pages
// show (migration visitor-page-epoch-triggers), so every app process on the database sees a change on its next request.
import { client } from '../db';

/** The epoch now: one indexed read of a one-row table. */
export async function readContentEpoch(): Promise<bigint> {
	const [row] = await client<{ epoch: string }[]>`select epoch from visitor_page_epoch where id = 1`;
	if (!row) throw new Error('visitor_page_epoch has no row: apply the migrations');
	return BigInt(row.epoch);
}
