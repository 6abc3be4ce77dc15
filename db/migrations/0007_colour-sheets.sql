ALTER TABLE `colour_sheets` DROP INDEX `colour_sheets_slug_unique`;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` DROP FOREIGN KEY `colour_sheet_items_swatch_id_swatches_id_fk`;
--> statement-breakpoint
ALTER TABLE `colour_sheet_items` MODIFY COLUMN `swatch_id` int;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD `kind` enum('heading','swatch') NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD `heading` varchar(160);--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD `coupon_id` int;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD `snapshot` json;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD `caption` varchar(280);--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD `hide_temperature` boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD `hide_hold` boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD `hide_process` boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD `hide_alloy` boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheets` ADD `units` enum('c','f') DEFAULT 'c' NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheets` ADD `page_size` enum('a4','letter') DEFAULT 'a4' NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheets` ADD `orientation` enum('portrait','landscape') DEFAULT 'portrait' NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheets` ADD `audience` enum('class','public') DEFAULT 'class' NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheets` ADD `show_prediction` boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD CONSTRAINT `colour_sheet_items_position_idx` UNIQUE(`sheet_id`,`position`);--> statement-breakpoint
-- After the unique index on (sheet_id, position), which serves the sheet foreign key in its place.
DROP INDEX `colour_sheet_items_sheet_idx` ON `colour_sheet_items`;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD CONSTRAINT `colour_sheet_items_coupon_id_coupons_id_fk` FOREIGN KEY (`coupon_id`) REFERENCES `coupons`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD CONSTRAINT `colour_sheet_items_swatch_id_swatches_id_fk` FOREIGN KEY (`swatch_id`) REFERENCES `swatches`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `colour_sheet_items_swatch_idx` ON `colour_sheet_items` (`swatch_id`);--> statement-breakpoint
CREATE INDEX `colour_sheet_items_coupon_idx` ON `colour_sheet_items` (`coupon_id`);--> statement-breakpoint
CREATE INDEX `colour_sheets_class_idx` ON `colour_sheets` (`class_id`);--> statement-breakpoint
CREATE INDEX `colour_sheets_status_idx` ON `colour_sheets` (`status`,`audience`);--> statement-breakpoint
ALTER TABLE `colour_sheet_items` DROP COLUMN `note`;--> statement-breakpoint
ALTER TABLE `colour_sheets` DROP COLUMN `slug`;