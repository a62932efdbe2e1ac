CREATE TABLE `report_leveling` (
	`tenant_id` varchar(36) NOT NULL,
	`adjustment_id` varchar(36) character set ascii collate ascii_bin NOT NULL,
	`station_id` varchar(36) character set ascii collate ascii_bin NOT NULL,
	`at` datetime(3) NOT NULL,
	`amount_milli` int NOT NULL,
	`before_readings` int NOT NULL,
	`before_sum_nm` bigint NOT NULL,
	`after_readings` int NOT NULL,
	`after_sum_nm` bigint NOT NULL,
	`window_from` datetime(3),
	`window_to` datetime(3),
	CONSTRAINT `report_leveling_pk` PRIMARY KEY(`tenant_id`,`adjustment_id`)
);
--> statement-breakpoint
ALTER TABLE `report_leveling` ADD CONSTRAINT `report_leveling_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `report_leveling_tenant_at_idx` ON `report_leveling` (`tenant_id`,`at`);