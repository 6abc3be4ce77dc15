-- Account identity and live sessions.
--
-- Written partly by hand: drizzle-kit generated only the last two statements (the `sessions`
-- column and index). Drizzle's MySQL columns can't declare a collation, so the collation changes
-- and the data conversion below were added by hand; the schema files say so beside each column.
--
-- 1. E-mail addresses are compared exactly. Existing addresses are stored in the normalised form
--    (trimmed, lower-cased; src/lib/email-address.ts) and the columns get utf8mb4_nopad_bin: byte
--    for byte, no case or accent folding, trailing spaces count. The old utf8mb4_unicode_ci unique
--    index already forbade two accounts whose addresses differ only in case, accents or trailing
--    spaces, so lower-casing existing rows can't make two alike.
UPDATE `users` SET `email` = LOWER(TRIM(`email`));--> statement-breakpoint
ALTER TABLE `users` MODIFY COLUMN `email` varchar(255) CHARACTER SET utf8mb4 COLLATE utf8mb4_nopad_bin NOT NULL;--> statement-breakpoint
UPDATE `invitations` SET `email` = LOWER(TRIM(`email`));--> statement-breakpoint
ALTER TABLE `invitations` MODIFY COLUMN `email` varchar(255) CHARACTER SET utf8mb4 COLLATE utf8mb4_nopad_bin NOT NULL;--> statement-breakpoint
-- Sign-in links mailed under the old, folding comparison are void (each lasted 15 minutes anyway).
DELETE FROM `verification_tokens`;--> statement-breakpoint
ALTER TABLE `verification_tokens` MODIFY COLUMN `identifier` varchar(255) CHARACTER SET utf8mb4 COLLATE utf8mb4_nopad_bin NOT NULL;--> statement-breakpoint
ALTER TABLE `verification_tokens` MODIFY COLUMN `token` varchar(255) CHARACTER SET utf8mb4 COLLATE utf8mb4_nopad_bin NOT NULL;--> statement-breakpoint
-- 2. Live sessions: every session cookie names its row in `sessions` (unused until now: Auth.js
--    never writes it with JWT sessions). Cookies issued before this migration name no row, so
--    everyone signs in once more.
DELETE FROM `sessions`;--> statement-breakpoint
ALTER TABLE `sessions` MODIFY COLUMN `session_token` varchar(255) CHARACTER SET utf8mb4 COLLATE utf8mb4_nopad_bin NOT NULL;--> statement-breakpoint
ALTER TABLE `sessions` ADD `created_at` timestamp(3) DEFAULT (now()) NOT NULL;--> statement-breakpoint
CREATE INDEX `sessions_user_idx` ON `sessions` (`user_id`);
