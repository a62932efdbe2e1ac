ALTER TABLE `report_work_hour` ADD `staffed_total` int DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `report_work_hour` ADD `staffed_station` int DEFAULT 0 NOT NULL;--> statement-breakpoint
CREATE INDEX `report_work_hour_wheel_idx` ON `report_work_hour` (`tenant_id`,`wheel_id`,`day`);
--> statement-breakpoint
-- The summaries are rebuilt with the new columns: every rink's next refresh is a full one.
DELETE FROM `report_refresh`;