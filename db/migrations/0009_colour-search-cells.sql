ALTER TABLE `swatches` ADD `lab_l_cell` int GENERATED ALWAYS AS (floor(`lab_l` / 2)) STORED, ADD `lab_a_cell` int GENERATED ALWAYS AS (floor(`lab_a` / 4)) STORED;--> statement-breakpoint
CREATE INDEX `swatches_colour_cell_idx` ON `swatches` (`is_mean`,`lab_l_cell`,`lab_a_cell`,`lab_b`,`lab_l`,`lab_a`);--> statement-breakpoint
CREATE INDEX `swatches_alloy_colour_cell_idx` ON `swatches` (`alloy_id`,`is_mean`,`lab_l_cell`,`lab_a_cell`,`lab_b`,`lab_l`,`lab_a`);--> statement-breakpoint
DROP INDEX `swatches_alloy_colour_idx` ON `swatches`;--> statement-breakpoint
DROP INDEX `swatches_colour_idx` ON `swatches`;
