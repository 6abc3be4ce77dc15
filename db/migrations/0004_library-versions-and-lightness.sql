CREATE TABLE `library_versions` (
	`alloy_id` int NOT NULL,
	`version` bigint NOT NULL DEFAULT 0,
	CONSTRAINT `library_versions_alloy_id` PRIMARY KEY(`alloy_id`)
);
--> statement-breakpoint
ALTER TABLE `coupons` ADD `dominant_lab_l` double;--> statement-breakpoint
ALTER TABLE `library_versions` ADD CONSTRAINT `library_versions_alloy_id_alloys_id_fk` FOREIGN KEY (`alloy_id`) REFERENCES `alloys`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `coupons_lightness_idx` ON `coupons` (`dominant_lab_l`);--> statement-breakpoint
CREATE INDEX `coupons_created_idx` ON `coupons` (`created_at`);--> statement-breakpoint
-- Written by hand: coupons measured before this column existed get their first layer's dominant L*.
UPDATE `coupons` SET `dominant_lab_l` = (
	SELECT `s`.`lab_l` FROM `swatches` `s` JOIN `coupon_layers` `l` ON `l`.`id` = `s`.`layer_id`
	WHERE `l`.`coupon_id` = `coupons`.`id` AND `l`.`position` = 0 AND `s`.`is_mean` = false
	ORDER BY `s`.`share` DESC, `s`.`id` ASC LIMIT 1
);
