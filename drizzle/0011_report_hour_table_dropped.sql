DROP TABLE `report_work_hour`;--> statement-breakpoint
-- Summaries are derived data: with the hour table gone, every rink's next refresh rebuilds its day tables whole.
DELETE FROM `report_refresh`;
