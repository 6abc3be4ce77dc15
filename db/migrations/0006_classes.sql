ALTER TABLE `classes` ADD `term` varchar(80);--> statement-breakpoint
ALTER TABLE `invitations` ADD `accepted_by` varchar(255);--> statement-breakpoint
ALTER TABLE `invitations` ADD `revoked_at` timestamp;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_accepted_by_users_id_fk` FOREIGN KEY (`accepted_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `invitations_email_idx` ON `invitations` (`email`);