CREATE TABLE `report_credit_day` (
	`tenant_id` varchar(36) NOT NULL,
	`day` date NOT NULL,
	`kind` varchar(16) NOT NULL,
	`product_id` varchar(36) NOT NULL,
	`credits` bigint NOT NULL,
	`value_minor` bigint NOT NULL,
	CONSTRAINT `report_credit_day_pk` PRIMARY KEY(`tenant_id`,`day`,`kind`,`product_id`)
);
--> statement-breakpoint
CREATE TABLE `report_money_day` (
	`tenant_id` varchar(36) NOT NULL,
	`day` date NOT NULL,
	`product_id` varchar(36) NOT NULL,
	`channel` varchar(16) NOT NULL,
	`sales` int NOT NULL,
	`sales_minor` bigint NOT NULL,
	`fees_minor` bigint NOT NULL,
	`refunds` int NOT NULL,
	`refunds_minor` bigint NOT NULL,
	CONSTRAINT `report_money_day_pk` PRIMARY KEY(`tenant_id`,`day`,`product_id`,`channel`)
);
--> statement-breakpoint
CREATE TABLE `report_refresh` (
	`tenant_id` varchar(36) NOT NULL,
	`through` datetime(3) NOT NULL,
	`refreshed_at` datetime(3) NOT NULL,
	CONSTRAINT `report_refresh_tenant_id` PRIMARY KEY(`tenant_id`)
);
--> statement-breakpoint
CREATE TABLE `report_turnaround` (
	`tenant_id` varchar(36) NOT NULL,
	`day` date NOT NULL,
	`station_id` varchar(36) NOT NULL,
	`bucket` smallint NOT NULL,
	`tickets` int NOT NULL,
	`on_time` int NOT NULL,
	CONSTRAINT `report_turnaround_pk` PRIMARY KEY(`tenant_id`,`day`,`station_id`,`bucket`)
);
--> statement-breakpoint
CREATE TABLE `report_work_hour` (
	`tenant_id` varchar(36) NOT NULL,
	`day` date NOT NULL,
	`hour` smallint NOT NULL,
	`station_id` varchar(36) NOT NULL,
	`technician_id` varchar(36) NOT NULL,
	`wheel_id` varchar(36) NOT NULL,
	`pairs` int NOT NULL,
	`passes` int NOT NULL,
	`first_readings` int NOT NULL,
	`first_true` int NOT NULL,
	`first_fair` int NOT NULL,
	`first_off` int NOT NULL,
	`reruns` int NOT NULL,
	`first_abs_nm` bigint NOT NULL,
	CONSTRAINT `report_work_hour_pk` PRIMARY KEY(`tenant_id`,`day`,`hour`,`station_id`,`technician_id`,`wheel_id`)
);
--> statement-breakpoint
ALTER TABLE `rink_billing` ADD `suspended_at` datetime(3);--> statement-breakpoint
ALTER TABLE `rink_billing` ADD `suspended_reason` varchar(300);--> statement-breakpoint
ALTER TABLE `report_credit_day` ADD CONSTRAINT `report_credit_day_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `report_money_day` ADD CONSTRAINT `report_money_day_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `report_refresh` ADD CONSTRAINT `report_refresh_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `report_turnaround` ADD CONSTRAINT `report_turnaround_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `report_work_hour` ADD CONSTRAINT `report_work_hour_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `level_reading_tenant_taken_idx` ON `level_reading` (`tenant_id`,`taken_at`);--> statement-breakpoint
CREATE INDEX `sharpening_tenant_created_idx` ON `sharpening` (`tenant_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `sharpening_tenant_done_idx` ON `sharpening` (`tenant_id`,`done_at`);--> statement-breakpoint
CREATE INDEX `ticket_tenant_ready_idx` ON `ticket` (`tenant_id`,`ready_at`);--> statement-breakpoint
CREATE INDEX `ticket_event_tenant_at_idx` ON `ticket_event` (`tenant_id`,`at`);--> statement-breakpoint
CREATE INDEX `refund_tenant_created_idx` ON `refund` (`tenant_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `credit_entry_tenant_created_idx` ON `credit_entry` (`tenant_id`,`created_at`);