CREATE TABLE `report_drift_day` (
	`tenant_id` varchar(36) NOT NULL,
	`day` date NOT NULL,
	`station_id` varchar(36) NOT NULL,
	`raised` int NOT NULL,
	`cleared` int NOT NULL,
	CONSTRAINT `report_drift_day_pk` PRIMARY KEY(`tenant_id`,`day`,`station_id`)
);
--> statement-breakpoint
ALTER TABLE `report_drift_day` ADD CONSTRAINT `report_drift_day_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;