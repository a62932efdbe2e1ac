CREATE TABLE `report_wheel_day` (
	`tenant_id` varchar(36) NOT NULL,
	`wheel_id` varchar(36) character set ascii collate ascii_bin NOT NULL,
	`day` date NOT NULL,
	`pairs` int NOT NULL,
	`passes` int NOT NULL,
	CONSTRAINT `report_wheel_day_pk` PRIMARY KEY(`tenant_id`,`wheel_id`,`day`)
);
--> statement-breakpoint
CREATE TABLE `report_work_day` (
	`tenant_id` varchar(36) NOT NULL,
	`day` date NOT NULL,
	`station_id` varchar(36) character set ascii collate ascii_bin NOT NULL,
	`technician_id` varchar(36) character set ascii collate ascii_bin NOT NULL,
	`pairs` int NOT NULL,
	`first_readings` int NOT NULL,
	`first_true` int NOT NULL,
	`first_fair` int NOT NULL,
	`first_off` int NOT NULL,
	`reruns` int NOT NULL,
	`first_abs_nm` bigint NOT NULL,
	`staffed_total` int NOT NULL,
	`staffed_station` int NOT NULL,
	`pairs_h00` int NOT NULL DEFAULT 0,
	`pairs_h01` int NOT NULL DEFAULT 0,
	`pairs_h02` int NOT NULL DEFAULT 0,
	`pairs_h03` int NOT NULL DEFAULT 0,
	`pairs_h04` int NOT NULL DEFAULT 0,
	`pairs_h05` int NOT NULL DEFAULT 0,
	`pairs_h06` int NOT NULL DEFAULT 0,
	`pairs_h07` int NOT NULL DEFAULT 0,
	`pairs_h08` int NOT NULL DEFAULT 0,
	`pairs_h09` int NOT NULL DEFAULT 0,
	`pairs_h10` int NOT NULL DEFAULT 0,
	`pairs_h11` int NOT NULL DEFAULT 0,
	`pairs_h12` int NOT NULL DEFAULT 0,
	`pairs_h13` int NOT NULL DEFAULT 0,
	`pairs_h14` int NOT NULL DEFAULT 0,
	`pairs_h15` int NOT NULL DEFAULT 0,
	`pairs_h16` int NOT NULL DEFAULT 0,
	`pairs_h17` int NOT NULL DEFAULT 0,
	`pairs_h18` int NOT NULL DEFAULT 0,
	`pairs_h19` int NOT NULL DEFAULT 0,
	`pairs_h20` int NOT NULL DEFAULT 0,
	`pairs_h21` int NOT NULL DEFAULT 0,
	`pairs_h22` int NOT NULL DEFAULT 0,
	`pairs_h23` int NOT NULL DEFAULT 0,
	CONSTRAINT `report_work_day_pk` PRIMARY KEY(`tenant_id`,`day`,`station_id`,`technician_id`)
);
--> statement-breakpoint
ALTER TABLE `report_credit_day` MODIFY COLUMN `product_id` varchar(36) character set ascii collate ascii_bin NOT NULL;--> statement-breakpoint
ALTER TABLE `report_drift_day` MODIFY COLUMN `station_id` varchar(36) character set ascii collate ascii_bin NOT NULL;--> statement-breakpoint
ALTER TABLE `report_money_day` MODIFY COLUMN `product_id` varchar(36) character set ascii collate ascii_bin NOT NULL;--> statement-breakpoint
ALTER TABLE `report_turnaround` MODIFY COLUMN `station_id` varchar(36) character set ascii collate ascii_bin NOT NULL;--> statement-breakpoint
ALTER TABLE `report_wheel_day` ADD CONSTRAINT `report_wheel_day_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `report_work_day` ADD CONSTRAINT `report_work_day_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;