CREATE TABLE `desk_settings` (
	`tenant_id` varchar(36) NOT NULL,
	`true_nm` int NOT NULL,
	`fair_nm` int NOT NULL,
	`precision_true_nm` int NOT NULL,
	`precision_fair_nm` int NOT NULL,
	`default_response_nm_per_turn` int NOT NULL,
	`default_minutes_per_pair` int NOT NULL,
	`ewma_lambda_milli` int NOT NULL,
	`ewma_k_milli` int NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `desk_settings_pk` PRIMARY KEY(`tenant_id`)
);
--> statement-breakpoint
CREATE TABLE `leveling_adjustment` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`station_id` varchar(36) NOT NULL,
	`amount_milli` int NOT NULL,
	`note` text,
	`at` datetime(3) NOT NULL,
	`by_user_id` varchar(36) NOT NULL,
	CONSTRAINT `leveling_adjustment_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `station` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`name` varchar(80) NOT NULL,
	`status` enum('active','maintenance','retired') NOT NULL,
	`rpm` int NOT NULL,
	`adjust_unit` enum('turns','mm') NOT NULL,
	`adjust_step_milli` int NOT NULL,
	`own_true_nm` int,
	`own_fair_nm` int,
	`precision` boolean NOT NULL DEFAULT false,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `station_id` PRIMARY KEY(`id`),
	CONSTRAINT `station_tenant_id_unique` UNIQUE(`tenant_id`,`id`),
	CONSTRAINT `station_tenant_name_unique` UNIQUE(`tenant_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `wheel` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`station_id` varchar(36) NOT NULL,
	`label` varchar(80) NOT NULL,
	`grit` int NOT NULL,
	`diameter_new_nm` int NOT NULL,
	`min_diameter_nm` int NOT NULL,
	`rated_max_rpm` int NOT NULL,
	`mounted_at` datetime(3) NOT NULL,
	`mounted_by` varchar(36) NOT NULL,
	`removed_at` datetime(3),
	CONSTRAINT `wheel_id` PRIMARY KEY(`id`),
	CONSTRAINT `wheel_tenant_id_unique` UNIQUE(`tenant_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `wheel_event` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`wheel_id` varchar(36) NOT NULL,
	`station_id` varchar(36) NOT NULL,
	`kind` enum('mount','dressing','removal') NOT NULL,
	`hollow_nm` int,
	`diameter_nm` int,
	`note` text,
	`at` datetime(3) NOT NULL,
	`by_user_id` varchar(36) NOT NULL,
	CONSTRAINT `wheel_event_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `idempotency_key` (
	`tenant_id` varchar(36) NOT NULL,
	`idem_key` varchar(100) NOT NULL,
	`route` varchar(200) NOT NULL,
	`request_hash` char(64) NOT NULL,
	`status_code` int NOT NULL,
	`response_body` text NOT NULL,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `idempotency_key_pk` PRIMARY KEY(`tenant_id`,`idem_key`)
);
--> statement-breakpoint
CREATE TABLE `level_reading` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`station_id` varchar(36) NOT NULL,
	`sharpening_id` varchar(36),
	`kind` enum('sharpening','check') NOT NULL,
	`blade` enum('left','right') NOT NULL,
	`attempt` int NOT NULL,
	`reading_nm` int NOT NULL,
	`tilt_millideg` int,
	`taken_at` datetime(3) NOT NULL,
	`taken_by` varchar(36) NOT NULL,
	CONSTRAINT `level_reading_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `service_item` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`name` varchar(80) NOT NULL,
	`kind` enum('standard','profiling','new_steel','add_on') NOT NULL,
	`price_minor` int NOT NULL,
	`active` int NOT NULL DEFAULT 1,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `service_item_id` PRIMARY KEY(`id`),
	CONSTRAINT `service_item_tenant_id_unique` UNIQUE(`tenant_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `sharpening` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`ticket_id` varchar(36) NOT NULL,
	`ticket_pair_id` varchar(36) NOT NULL,
	`station_id` varchar(36) NOT NULL,
	`wheel_id` varchar(36),
	`technician_id` varchar(36) NOT NULL,
	`hollow_nm` int NOT NULL,
	`passes` int NOT NULL,
	`blade_width_nm` int NOT NULL,
	`done_at` datetime(3) NOT NULL,
	`corrects_id` varchar(36),
	`correction_reason` text,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `sharpening_id` PRIMARY KEY(`id`),
	CONSTRAINT `sharpening_tenant_id_unique` UNIQUE(`tenant_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `skate_profile` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`customer_id` varchar(36) NOT NULL,
	`label` varchar(80) NOT NULL,
	`blade_width_nm` int,
	`preferred_hollow_nm` int,
	`profile_radius_nm` bigint,
	`notes` text,
	`created_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `skate_profile_id` PRIMARY KEY(`id`),
	CONSTRAINT `skate_profile_tenant_id_unique` UNIQUE(`tenant_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `ticket` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`number` int NOT NULL,
	`customer_id` varchar(36) NOT NULL,
	`state` enum('waiting','on_station','ready','collected','void') NOT NULL,
	`station_id` varchar(36),
	`payment` enum('counter','no_charge') NOT NULL,
	`notes` text,
	`dropped_at` datetime(3) NOT NULL,
	`promised_at` datetime(3) NOT NULL,
	`started_at` datetime(3),
	`ready_at` datetime(3),
	`collected_at` datetime(3),
	`void_reason` text,
	`created_by` varchar(36) NOT NULL,
	CONSTRAINT `ticket_id` PRIMARY KEY(`id`),
	CONSTRAINT `ticket_tenant_id_unique` UNIQUE(`tenant_id`,`id`),
	CONSTRAINT `ticket_tenant_number_unique` UNIQUE(`tenant_id`,`number`)
);
--> statement-breakpoint
CREATE TABLE `ticket_event` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`ticket_id` varchar(36) NOT NULL,
	`from_state` enum('waiting','on_station','ready','collected','void'),
	`to_state` enum('waiting','on_station','ready','collected','void') NOT NULL,
	`station_id` varchar(36),
	`reason` text,
	`at` datetime(3) NOT NULL,
	`by_user_id` varchar(36) NOT NULL,
	CONSTRAINT `ticket_event_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `ticket_pair` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`ticket_id` varchar(36) NOT NULL,
	`position` int NOT NULL,
	`skate_profile_id` varchar(36),
	`label` varchar(80) NOT NULL,
	`blade_width_nm` int,
	`hollow_nm` int,
	`service_id` varchar(36) NOT NULL,
	`price_minor` int NOT NULL,
	`notes` text,
	CONSTRAINT `ticket_pair_id` PRIMARY KEY(`id`),
	CONSTRAINT `ticket_pair_tenant_id_unique` UNIQUE(`tenant_id`,`id`),
	CONSTRAINT `ticket_pair_tenant_ticket_position_unique` UNIQUE(`tenant_id`,`ticket_id`,`position`)
);
--> statement-breakpoint
ALTER TABLE `desk_settings` ADD CONSTRAINT `desk_settings_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `leveling_adjustment` ADD CONSTRAINT `leveling_adjustment_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `leveling_adjustment` ADD CONSTRAINT `leveling_adjustment_station_fk` FOREIGN KEY (`tenant_id`,`station_id`) REFERENCES `station`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `station` ADD CONSTRAINT `station_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `wheel` ADD CONSTRAINT `wheel_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `wheel` ADD CONSTRAINT `wheel_station_fk` FOREIGN KEY (`tenant_id`,`station_id`) REFERENCES `station`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `wheel_event` ADD CONSTRAINT `wheel_event_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `wheel_event` ADD CONSTRAINT `wheel_event_wheel_fk` FOREIGN KEY (`tenant_id`,`wheel_id`) REFERENCES `wheel`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `idempotency_key` ADD CONSTRAINT `idempotency_key_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `level_reading` ADD CONSTRAINT `level_reading_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `level_reading` ADD CONSTRAINT `level_reading_station_fk` FOREIGN KEY (`tenant_id`,`station_id`) REFERENCES `station`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `level_reading` ADD CONSTRAINT `level_reading_sharpening_fk` FOREIGN KEY (`tenant_id`,`sharpening_id`) REFERENCES `sharpening`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `service_item` ADD CONSTRAINT `service_item_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sharpening` ADD CONSTRAINT `sharpening_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sharpening` ADD CONSTRAINT `sharpening_ticket_fk` FOREIGN KEY (`tenant_id`,`ticket_id`) REFERENCES `ticket`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sharpening` ADD CONSTRAINT `sharpening_pair_fk` FOREIGN KEY (`tenant_id`,`ticket_pair_id`) REFERENCES `ticket_pair`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sharpening` ADD CONSTRAINT `sharpening_station_fk` FOREIGN KEY (`tenant_id`,`station_id`) REFERENCES `station`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `sharpening` ADD CONSTRAINT `sharpening_wheel_fk` FOREIGN KEY (`tenant_id`,`wheel_id`) REFERENCES `wheel`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `skate_profile` ADD CONSTRAINT `skate_profile_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `skate_profile` ADD CONSTRAINT `skate_profile_customer_fk` FOREIGN KEY (`tenant_id`,`customer_id`) REFERENCES `customer`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ticket` ADD CONSTRAINT `ticket_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ticket` ADD CONSTRAINT `ticket_customer_fk` FOREIGN KEY (`tenant_id`,`customer_id`) REFERENCES `customer`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ticket` ADD CONSTRAINT `ticket_station_fk` FOREIGN KEY (`tenant_id`,`station_id`) REFERENCES `station`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ticket_event` ADD CONSTRAINT `ticket_event_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ticket_event` ADD CONSTRAINT `ticket_event_ticket_fk` FOREIGN KEY (`tenant_id`,`ticket_id`) REFERENCES `ticket`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ticket_pair` ADD CONSTRAINT `ticket_pair_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ticket_pair` ADD CONSTRAINT `ticket_pair_ticket_fk` FOREIGN KEY (`tenant_id`,`ticket_id`) REFERENCES `ticket`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ticket_pair` ADD CONSTRAINT `ticket_pair_service_fk` FOREIGN KEY (`tenant_id`,`service_id`) REFERENCES `service_item`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ticket_pair` ADD CONSTRAINT `ticket_pair_profile_fk` FOREIGN KEY (`tenant_id`,`skate_profile_id`) REFERENCES `skate_profile`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `leveling_adjustment_tenant_station_idx` ON `leveling_adjustment` (`tenant_id`,`station_id`,`at`);--> statement-breakpoint
CREATE INDEX `wheel_tenant_station_idx` ON `wheel` (`tenant_id`,`station_id`,`removed_at`);--> statement-breakpoint
CREATE INDEX `wheel_event_tenant_wheel_idx` ON `wheel_event` (`tenant_id`,`wheel_id`,`at`);--> statement-breakpoint
CREATE INDEX `level_reading_tenant_station_idx` ON `level_reading` (`tenant_id`,`station_id`,`taken_at`);--> statement-breakpoint
CREATE INDEX `level_reading_tenant_sharpening_idx` ON `level_reading` (`tenant_id`,`sharpening_id`,`blade`,`attempt`);--> statement-breakpoint
CREATE INDEX `sharpening_tenant_station_idx` ON `sharpening` (`tenant_id`,`station_id`,`done_at`);--> statement-breakpoint
CREATE INDEX `sharpening_tenant_ticket_idx` ON `sharpening` (`tenant_id`,`ticket_id`);--> statement-breakpoint
CREATE INDEX `sharpening_tenant_pair_idx` ON `sharpening` (`tenant_id`,`ticket_pair_id`);--> statement-breakpoint
CREATE INDEX `skate_profile_tenant_customer_idx` ON `skate_profile` (`tenant_id`,`customer_id`);--> statement-breakpoint
CREATE INDEX `ticket_tenant_state_idx` ON `ticket` (`tenant_id`,`state`,`promised_at`);--> statement-breakpoint
CREATE INDEX `ticket_tenant_customer_idx` ON `ticket` (`tenant_id`,`customer_id`,`dropped_at`);--> statement-breakpoint
CREATE INDEX `ticket_event_tenant_ticket_idx` ON `ticket_event` (`tenant_id`,`ticket_id`,`at`);