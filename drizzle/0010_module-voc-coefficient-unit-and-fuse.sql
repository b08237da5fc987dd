ALTER TABLE `module_model` ADD `voc_coeff_value` double;--> statement-breakpoint
ALTER TABLE `module_model` ADD `voc_coeff_unit` enum('pct_per_c','mv_per_c','v_per_c') DEFAULT 'pct_per_c' NOT NULL;--> statement-breakpoint
ALTER TABLE `module_model` ADD `max_series_fuse_a` double;