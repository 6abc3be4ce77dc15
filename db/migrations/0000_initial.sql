CREATE TABLE `account_tokens` (
	`id` int AUTO_INCREMENT NOT NULL,
	`user_id` varchar(255) NOT NULL,
	`purpose` enum('verify-email','reset-password') NOT NULL,
	`token_hash` char(64) NOT NULL,
	`expires_at` timestamp NOT NULL,
	`used_at` timestamp,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `account_tokens_id` PRIMARY KEY(`id`),
	CONSTRAINT `account_tokens_hash_idx` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `accounts` (
	`user_id` varchar(255) NOT NULL,
	`type` varchar(255) NOT NULL,
	`provider` varchar(255) NOT NULL,
	`provider_account_id` varchar(255) NOT NULL,
	`refresh_token` varchar(2048),
	`access_token` varchar(2048),
	`expires_at` int,
	`token_type` varchar(255),
	`scope` varchar(255),
	`id_token` varchar(2048),
	`session_state` varchar(255),
	CONSTRAINT `accounts_provider_provider_account_id_pk` PRIMARY KEY(`provider`,`provider_account_id`)
);
--> statement-breakpoint
CREATE TABLE `rate_limits` (
	`bucket` varchar(255) NOT NULL,
	`window_start` timestamp NOT NULL,
	`hits` int NOT NULL DEFAULT 0,
	CONSTRAINT `rate_limits_bucket` PRIMARY KEY(`bucket`)
);
--> statement-breakpoint
CREATE TABLE `sessions` (
	`session_token` varchar(255) NOT NULL,
	`user_id` varchar(255) NOT NULL,
	`expires` timestamp NOT NULL,
	CONSTRAINT `sessions_session_token` PRIMARY KEY(`session_token`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` varchar(255) NOT NULL,
	`name` varchar(255),
	`email` varchar(255) NOT NULL,
	`email_verified` timestamp(3),
	`image` varchar(255),
	`role` enum('member','instructor','admin') NOT NULL DEFAULT 'member',
	`password_hash` varchar(255),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_unique` UNIQUE(`email`)
);
--> statement-breakpoint
CREATE TABLE `verification_tokens` (
	`identifier` varchar(255) NOT NULL,
	`token` varchar(255) NOT NULL,
	`expires` timestamp NOT NULL,
	CONSTRAINT `verification_tokens_identifier_token_pk` PRIMARY KEY(`identifier`,`token`)
);
--> statement-breakpoint
CREATE TABLE `alloys` (
	`id` int AUTO_INCREMENT NOT NULL,
	`slug` varchar(64) NOT NULL,
	`name` varchar(128) NOT NULL,
	`family` enum('titanium','carbon-steel','stainless-steel','copper','bronze','brass','zirconium','niobium') NOT NULL,
	`uns` varchar(16),
	`notes` text,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `alloys_id` PRIMARY KEY(`id`),
	CONSTRAINT `alloys_slug_unique` UNIQUE(`slug`)
);
--> statement-breakpoint
CREATE TABLE `coupon_layers` (
	`id` int AUTO_INCREMENT NOT NULL,
	`coupon_id` int NOT NULL,
	`position` smallint NOT NULL,
	`alloy_id` int NOT NULL,
	CONSTRAINT `coupon_layers_id` PRIMARY KEY(`id`),
	CONSTRAINT `coupon_layers_position_idx` UNIQUE(`coupon_id`,`position`)
);
--> statement-breakpoint
CREATE TABLE `coupons` (
	`id` int AUTO_INCREMENT NOT NULL,
	`owner_id` varchar(255) NOT NULL,
	`title` varchar(160) NOT NULL,
	`layer_key` varchar(255) NOT NULL,
	`surface_prep` enum('ground','blasted','etched','polished','as-forged','other') NOT NULL,
	`surface_grit` smallint,
	`process` enum('oven','forge','torch','induction','anodize') NOT NULL,
	`temperature_c` double,
	`temperature_method` enum('thermocouple','pyrometer','oven-setpoint','estimated'),
	`hold_seconds` int,
	`volts` double,
	`atmosphere` enum('air','argon','other') NOT NULL DEFAULT 'air',
	`argon_flow_lpm` double,
	`atmosphere_note` varchar(255),
	`cooling` enum('still-air','forced-air','water-quench','oil-quench','in-furnace','in-can','other'),
	`notes` text,
	`visibility` enum('private','members','public') NOT NULL DEFAULT 'private',
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `coupons_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `photos` (
	`id` int AUTO_INCREMENT NOT NULL,
	`coupon_id` int NOT NULL,
	`owner_id` varchar(255) NOT NULL,
	`original_key` varchar(512) NOT NULL,
	`display_key` varchar(512) NOT NULL,
	`thumb_key` varchar(512) NOT NULL,
	`content_type` varchar(64) NOT NULL,
	`byte_size` bigint NOT NULL,
	`width` int NOT NULL,
	`height` int NOT NULL,
	`taken_at` timestamp,
	`camera` varchar(160),
	`lens` varchar(160),
	`exposure` varchar(160),
	`white_balance` varchar(32),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `photos_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `regions` (
	`id` int AUTO_INCREMENT NOT NULL,
	`photo_id` int NOT NULL,
	`kind` enum('layer','grey') NOT NULL,
	`layer_id` int,
	`x` int NOT NULL,
	`y` int NOT NULL,
	`width` int NOT NULL,
	`height` int NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `regions_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `swatches` (
	`id` int AUTO_INCREMENT NOT NULL,
	`region_id` int,
	`photo_id` int NOT NULL,
	`coupon_id` int NOT NULL,
	`layer_id` int,
	`alloy_id` int,
	`rank` smallint NOT NULL,
	`is_mean` boolean NOT NULL DEFAULT false,
	`share` double NOT NULL,
	`spread` double NOT NULL,
	`hex` char(7) NOT NULL,
	`lab_l` double NOT NULL,
	`lab_a` double NOT NULL,
	`lab_b` double NOT NULL,
	`oklab_l` double NOT NULL,
	`oklab_a` double NOT NULL,
	`oklab_b` double NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `swatches_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `uploads` (
	`object_key` varchar(512) NOT NULL,
	`owner_id` varchar(255) NOT NULL,
	`content_type` varchar(64) NOT NULL,
	`byte_size` bigint NOT NULL,
	`expires_at` timestamp NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `uploads_object_key` PRIMARY KEY(`object_key`)
);
--> statement-breakpoint
CREATE TABLE `class_coupons` (
	`class_id` int NOT NULL,
	`coupon_id` int NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `class_coupons_class_id_coupon_id_pk` PRIMARY KEY(`class_id`,`coupon_id`)
);
--> statement-breakpoint
CREATE TABLE `class_members` (
	`class_id` int NOT NULL,
	`user_id` varchar(255) NOT NULL,
	`role` enum('student','instructor') NOT NULL DEFAULT 'student',
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `class_members_class_id_user_id_pk` PRIMARY KEY(`class_id`,`user_id`)
);
--> statement-breakpoint
CREATE TABLE `classes` (
	`id` int AUTO_INCREMENT NOT NULL,
	`instructor_id` varchar(255) NOT NULL,
	`name` varchar(160) NOT NULL,
	`description` text,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `classes_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `colour_sheet_items` (
	`id` int AUTO_INCREMENT NOT NULL,
	`sheet_id` int NOT NULL,
	`swatch_id` int NOT NULL,
	`position` smallint NOT NULL,
	`note` text,
	CONSTRAINT `colour_sheet_items_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `colour_sheets` (
	`id` int AUTO_INCREMENT NOT NULL,
	`owner_id` varchar(255),
	`class_id` int,
	`slug` varchar(64) NOT NULL,
	`title` varchar(160) NOT NULL,
	`intro` text,
	`status` enum('draft','published') NOT NULL DEFAULT 'draft',
	`published_at` timestamp,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `colour_sheets_id` PRIMARY KEY(`id`),
	CONSTRAINT `colour_sheets_slug_unique` UNIQUE(`slug`)
);
--> statement-breakpoint
CREATE TABLE `invitations` (
	`id` int AUTO_INCREMENT NOT NULL,
	`class_id` int NOT NULL,
	`email` varchar(255) NOT NULL,
	`token_hash` char(64) NOT NULL,
	`invited_by` varchar(255) NOT NULL,
	`expires_at` timestamp NOT NULL,
	`accepted_at` timestamp,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `invitations_id` PRIMARY KEY(`id`),
	CONSTRAINT `invitations_token_idx` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `app_settings` (
	`setting_key` varchar(64) NOT NULL,
	`value` text NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `app_settings_setting_key` PRIMARY KEY(`setting_key`)
);
--> statement-breakpoint
ALTER TABLE `account_tokens` ADD CONSTRAINT `account_tokens_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `accounts` ADD CONSTRAINT `accounts_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sessions` ADD CONSTRAINT `sessions_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `coupon_layers` ADD CONSTRAINT `coupon_layers_coupon_id_coupons_id_fk` FOREIGN KEY (`coupon_id`) REFERENCES `coupons`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `coupon_layers` ADD CONSTRAINT `coupon_layers_alloy_id_alloys_id_fk` FOREIGN KEY (`alloy_id`) REFERENCES `alloys`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `coupons` ADD CONSTRAINT `coupons_owner_id_users_id_fk` FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `photos` ADD CONSTRAINT `photos_coupon_id_coupons_id_fk` FOREIGN KEY (`coupon_id`) REFERENCES `coupons`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `photos` ADD CONSTRAINT `photos_owner_id_users_id_fk` FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `regions` ADD CONSTRAINT `regions_photo_id_photos_id_fk` FOREIGN KEY (`photo_id`) REFERENCES `photos`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `regions` ADD CONSTRAINT `regions_layer_id_coupon_layers_id_fk` FOREIGN KEY (`layer_id`) REFERENCES `coupon_layers`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `swatches` ADD CONSTRAINT `swatches_region_id_regions_id_fk` FOREIGN KEY (`region_id`) REFERENCES `regions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `swatches` ADD CONSTRAINT `swatches_photo_id_photos_id_fk` FOREIGN KEY (`photo_id`) REFERENCES `photos`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `swatches` ADD CONSTRAINT `swatches_coupon_id_coupons_id_fk` FOREIGN KEY (`coupon_id`) REFERENCES `coupons`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `swatches` ADD CONSTRAINT `swatches_layer_id_coupon_layers_id_fk` FOREIGN KEY (`layer_id`) REFERENCES `coupon_layers`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `swatches` ADD CONSTRAINT `swatches_alloy_id_alloys_id_fk` FOREIGN KEY (`alloy_id`) REFERENCES `alloys`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ADD CONSTRAINT `uploads_owner_id_users_id_fk` FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `class_coupons` ADD CONSTRAINT `class_coupons_class_id_classes_id_fk` FOREIGN KEY (`class_id`) REFERENCES `classes`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `class_coupons` ADD CONSTRAINT `class_coupons_coupon_id_coupons_id_fk` FOREIGN KEY (`coupon_id`) REFERENCES `coupons`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `class_members` ADD CONSTRAINT `class_members_class_id_classes_id_fk` FOREIGN KEY (`class_id`) REFERENCES `classes`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `class_members` ADD CONSTRAINT `class_members_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `classes` ADD CONSTRAINT `classes_instructor_id_users_id_fk` FOREIGN KEY (`instructor_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD CONSTRAINT `colour_sheet_items_sheet_id_colour_sheets_id_fk` FOREIGN KEY (`sheet_id`) REFERENCES `colour_sheets`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `colour_sheet_items` ADD CONSTRAINT `colour_sheet_items_swatch_id_swatches_id_fk` FOREIGN KEY (`swatch_id`) REFERENCES `swatches`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `colour_sheets` ADD CONSTRAINT `colour_sheets_owner_id_users_id_fk` FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `colour_sheets` ADD CONSTRAINT `colour_sheets_class_id_classes_id_fk` FOREIGN KEY (`class_id`) REFERENCES `classes`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_class_id_classes_id_fk` FOREIGN KEY (`class_id`) REFERENCES `classes`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invitations` ADD CONSTRAINT `invitations_invited_by_users_id_fk` FOREIGN KEY (`invited_by`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `account_tokens_user_idx` ON `account_tokens` (`user_id`);--> statement-breakpoint
CREATE INDEX `coupon_layers_alloy_idx` ON `coupon_layers` (`alloy_id`);--> statement-breakpoint
CREATE INDEX `coupons_owner_idx` ON `coupons` (`owner_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `coupons_visibility_idx` ON `coupons` (`visibility`,`created_at`);--> statement-breakpoint
CREATE INDEX `coupons_layer_key_idx` ON `coupons` (`layer_key`,`temperature_c`);--> statement-breakpoint
CREATE INDEX `coupons_process_idx` ON `coupons` (`process`,`temperature_c`);--> statement-breakpoint
CREATE INDEX `coupons_temperature_idx` ON `coupons` (`temperature_c`);--> statement-breakpoint
CREATE INDEX `coupons_hold_idx` ON `coupons` (`hold_seconds`);--> statement-breakpoint
CREATE INDEX `coupons_atmosphere_idx` ON `coupons` (`atmosphere`);--> statement-breakpoint
CREATE INDEX `photos_coupon_idx` ON `photos` (`coupon_id`);--> statement-breakpoint
CREATE INDEX `regions_photo_idx` ON `regions` (`photo_id`);--> statement-breakpoint
CREATE INDEX `swatches_region_idx` ON `swatches` (`region_id`);--> statement-breakpoint
CREATE INDEX `swatches_coupon_idx` ON `swatches` (`coupon_id`);--> statement-breakpoint
CREATE INDEX `swatches_alloy_colour_idx` ON `swatches` (`alloy_id`,`lab_l`,`lab_a`,`lab_b`);--> statement-breakpoint
CREATE INDEX `uploads_created_idx` ON `uploads` (`created_at`);--> statement-breakpoint
CREATE INDEX `class_coupons_coupon_idx` ON `class_coupons` (`coupon_id`);--> statement-breakpoint
CREATE INDEX `class_members_user_idx` ON `class_members` (`user_id`);--> statement-breakpoint
CREATE INDEX `classes_instructor_idx` ON `classes` (`instructor_id`);--> statement-breakpoint
CREATE INDEX `colour_sheet_items_sheet_idx` ON `colour_sheet_items` (`sheet_id`,`position`);--> statement-breakpoint
CREATE INDEX `colour_sheets_owner_idx` ON `colour_sheets` (`owner_id`);--> statement-breakpoint
CREATE INDEX `invitations_class_idx` ON `invitations` (`class_id`);