import type { Transaction } from 'sequelize';
import { initialFeeStatus } from '../../domain/dues';
import { Show } from '../db';
import type { EntryFeeStatus } from '../db/models/entry';

export { settleFeeOfWithdrawnEntry } from '../payments/refunds';

/**
 * The fee status a new entry of this show starts with: 'due' where the show charges an entry
 * fee, else 'not_required'. Call it in the transaction that creates the entry and store the
 * result in entries.fee_status. On withdrawal, call settleFeeOfWithdrawnEntry in the withdrawing
 * transaction (it queues the refund's job there).
 */
export async function feeStatusForNewEntry(
	showId: string,
	options: { transaction: Transaction }
): Promise<EntryFeeStatus> {
	const show = await Show.findByPk(showId, {
		attributes: ['entryFeeCents'],
		transaction: options.transaction
	});
	return show ? initialFeeStatus(show.entryFeeCents) : 'not_required';
}
