import { sql } from 'drizzle-orm';
import { check, index, integer, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './auth';
import { referrals } from './sharing';

// Assessment documents a physiotherapist attaches to a referral. The PDF itself lives in
// object storage under `storage_key`, a key the server chooses; the name the file had on her
// computer is kept here only as a label. The object is written before its row, so an object
// may briefly lack a row (an upload in flight, or one whose row failed): the sweeper in
// src/lib/server/documents/sweeper.ts removes those once they are old enough.

const tz = { withTimezone: true, mode: 'date' } as const;
// Millisecond precision: `uploaded_at` is part of the list cursor (see sharing.ts).
const tzMs = { withTimezone: true, mode: 'date', precision: 3 } as const;

/** `clinic`: the clinic's own record (the default). `studio`: shareable with the referring studio. */
export const documentShare = pgEnum('document_share', ['clinic', 'studio']);

export const documents = pgTable(
	'documents',
	{
		/** Chosen by the server before the object is written (the key contains it). */
		id: uuid('id').primaryKey(),
		referralId: uuid('referral_id')
			.notNull()
			.references(() => referrals.id, { onDelete: 'cascade' }),
		storageKey: text('storage_key').notNull().unique(),
		/** The uploaded file's own name, for people to recognise it; never used as a path. */
		fileName: text('file_name').notNull(),
		share: documentShare('share').notNull().default('clinic'),
		/** The physiotherapist's plain-language summary for the instructor. */
		summary: text('summary'),
		sizeBytes: integer('size_bytes').notNull(),
		pages: integer('pages').notNull(),
		/** Hex SHA-256 of the stored original, checked on every download. */
		sha256: text('sha256').notNull(),
		uploadedBy: uuid('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
		uploadedAt: timestamp('uploaded_at', tzMs).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', tz).notNull().defaultNow()
	},
	(t) => [
		index('documents_referral_idx').on(t.referralId, t.uploadedAt),
		// The documented limits (20 MB, 200 pages), held by the database as well.
		check('documents_size_limit', sql`${t.sizeBytes} between 1 and 20971520`),
		check('documents_page_limit', sql`${t.pages} between 1 and 200`),
		check('documents_sha256_hex', sql`${t.sha256} ~ '^[0-9a-f]{64}$'`)
	]
);
