CREATE TABLE `membership` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`customer_id` varchar(36) NOT NULL,
	`product_id` varchar(36) NOT NULL,
	`subscription_id` varchar(80) NOT NULL,
	`state` enum('incomplete','active','past_due','blocked','canceled') NOT NULL,
	`period_start` datetime(3),
	`period_end` datetime(3),
	`cancel_at_period_end` int NOT NULL DEFAULT 0,
	`grace_until` datetime(3),
	`service_updated_at` int NOT NULL DEFAULT 0,
	`created_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `membership_id` PRIMARY KEY(`id`),
	CONSTRAINT `membership_tenant_id_unique` UNIQUE(`tenant_id`,`id`),
	CONSTRAINT `membership_tenant_subscription_unique` UNIQUE(`tenant_id`,`subscription_id`)
);
--> statement-breakpoint
CREATE TABLE `payment` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`customer_id` varchar(36),
	`league_id` varchar(36),
	`product_id` varchar(36) NOT NULL,
	`price_id` varchar(36) NOT NULL,
	`membership_id` varchar(36),
	`channel` enum('online','counter') NOT NULL,
	`state` enum('pending','paid','failed','refunded','partially_refunded') NOT NULL,
	`amount_minor` int NOT NULL,
	`currency` char(3) NOT NULL,
	`fee_minor` int NOT NULL,
	`refunded_minor` int NOT NULL DEFAULT 0,
	`checkout_session_id` varchar(80),
	`payment_intent_id` varchar(80),
	`invoice_id` varchar(80),
	`service_updated_at` int NOT NULL DEFAULT 0,
	`created_by` varchar(36),
	`paid_at` datetime(3),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `payment_id` PRIMARY KEY(`id`),
	CONSTRAINT `payment_tenant_id_unique` UNIQUE(`tenant_id`,`id`),
	CONSTRAINT `payment_tenant_session_unique` UNIQUE(`tenant_id`,`checkout_session_id`),
	CONSTRAINT `payment_tenant_intent_unique` UNIQUE(`tenant_id`,`payment_intent_id`),
	CONSTRAINT `payment_tenant_invoice_unique` UNIQUE(`tenant_id`,`invoice_id`)
);
--> statement-breakpoint
CREATE TABLE `product` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`kind` enum('punch_card','membership','league_pack','single') NOT NULL,
	`name` varchar(120) NOT NULL,
	`description` text,
	`credits` int NOT NULL,
	`months_valid` int,
	`rollover_cap` int,
	`grace_days` int,
	`interval` enum('month','year'),
	`active` int NOT NULL DEFAULT 1,
	`listed` int NOT NULL DEFAULT 1,
	`payment_product_id` varchar(64),
	`created_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `product_id` PRIMARY KEY(`id`),
	CONSTRAINT `product_tenant_id_unique` UNIQUE(`tenant_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `product_price` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`product_id` varchar(36) NOT NULL,
	`amount_minor` int NOT NULL,
	`currency` char(3) NOT NULL,
	`payment_price_id` varchar(64),
	`retired_at` datetime(3),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `product_price_id` PRIMARY KEY(`id`),
	CONSTRAINT `product_price_tenant_id_unique` UNIQUE(`tenant_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `refund` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`payment_id` varchar(36) NOT NULL,
	`amount_minor` int NOT NULL,
	`credits` int NOT NULL,
	`payment_refund_id` varchar(80),
	`reason` text,
	`created_by` varchar(36) NOT NULL,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `refund_id` PRIMARY KEY(`id`),
	CONSTRAINT `refund_tenant_id_unique` UNIQUE(`tenant_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `rink_billing` (
	`tenant_id` varchar(36) NOT NULL,
	`connected_account_id` varchar(64),
	`charges_enabled` int NOT NULL DEFAULT 0,
	`fee_bps` int NOT NULL,
	`plan_customer_id` varchar(64),
	`plan_subscription_id` varchar(64),
	`plan_state` enum('none','active','past_due','read_only','canceled') NOT NULL DEFAULT 'none',
	`plan_stations` int NOT NULL DEFAULT 0,
	`plan_period_end` datetime(3),
	`plan_grace_until` datetime(3),
	`plan_service_updated_at` int NOT NULL DEFAULT 0,
	`test_clock_id` varchar(64),
	`platform_test_clock_id` varchar(64),
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `rink_billing_pk` PRIMARY KEY(`tenant_id`)
);
--> statement-breakpoint
CREATE TABLE `credit_account` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`kind` enum('skater','league_pool','team') NOT NULL,
	`customer_id` varchar(36),
	`league_id` varchar(36),
	`team_id` varchar(36),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `credit_account_id` PRIMARY KEY(`id`),
	CONSTRAINT `credit_account_tenant_id_unique` UNIQUE(`tenant_id`,`id`),
	CONSTRAINT `credit_account_tenant_customer_unique` UNIQUE(`tenant_id`,`customer_id`),
	CONSTRAINT `credit_account_tenant_team_unique` UNIQUE(`tenant_id`,`team_id`)
);
--> statement-breakpoint
CREATE TABLE `credit_entry` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`account_id` varchar(36) NOT NULL,
	`lot_id` varchar(36) NOT NULL,
	`kind` enum('purchase','grant','redeem','expire','refund','transfer','adjust','reversal') NOT NULL,
	`credits` int NOT NULL,
	`value_minor` int NOT NULL,
	`source` enum('payment','ticket','roster','membership','staff','league','system') NOT NULL,
	`source_id` varchar(80),
	`reason` text,
	`reverses_id` varchar(36),
	`operation_id` varchar(36) NOT NULL,
	`idem_key` varchar(120),
	`actor_user_id` varchar(36),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `credit_entry_id` PRIMARY KEY(`id`),
	CONSTRAINT `credit_entry_tenant_id_unique` UNIQUE(`tenant_id`,`id`),
	CONSTRAINT `credit_entry_tenant_key_unique` UNIQUE(`tenant_id`,`idem_key`)
);
--> statement-breakpoint
CREATE TABLE `credit_lot` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`account_id` varchar(36) NOT NULL,
	`origin` enum('purchase','membership','grant','adjust','transfer') NOT NULL,
	`credits` int NOT NULL,
	`remaining` int NOT NULL,
	`price_minor` int NOT NULL,
	`expires_at` datetime(3),
	`product_id` varchar(36),
	`payment_id` varchar(36),
	`membership_id` varchar(36),
	`from_lot_id` varchar(36),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `credit_lot_id` PRIMARY KEY(`id`),
	CONSTRAINT `credit_lot_tenant_id_unique` UNIQUE(`tenant_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `league` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`name` varchar(120) NOT NULL,
	`season` varchar(40),
	`manager_user_id` varchar(36),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `league_id` PRIMARY KEY(`id`),
	CONSTRAINT `league_tenant_id_unique` UNIQUE(`tenant_id`,`id`)
);
--> statement-breakpoint
CREATE TABLE `league_player` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`league_id` varchar(36) NOT NULL,
	`team_id` varchar(36) NOT NULL,
	`customer_id` varchar(36) NOT NULL,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `league_player_id` PRIMARY KEY(`id`),
	CONSTRAINT `league_player_tenant_id_unique` UNIQUE(`tenant_id`,`id`),
	CONSTRAINT `league_player_tenant_customer_unique` UNIQUE(`tenant_id`,`league_id`,`customer_id`)
);
--> statement-breakpoint
CREATE TABLE `league_team` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`league_id` varchar(36) NOT NULL,
	`name` varchar(120) NOT NULL,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `league_team_id` PRIMARY KEY(`id`),
	CONSTRAINT `league_team_tenant_id_unique` UNIQUE(`tenant_id`,`id`),
	CONSTRAINT `league_team_tenant_name_unique` UNIQUE(`tenant_id`,`league_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `roster_import` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36) NOT NULL,
	`league_id` varchar(36) NOT NULL,
	`file_hash` char(64) NOT NULL,
	`row_count` int NOT NULL,
	`created_by` varchar(36) NOT NULL,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `roster_import_id` PRIMARY KEY(`id`),
	CONSTRAINT `roster_import_tenant_hash_unique` UNIQUE(`tenant_id`,`league_id`,`file_hash`)
);
--> statement-breakpoint
CREATE TABLE `job_run` (
	`job` varchar(60) NOT NULL,
	`period` varchar(40) NOT NULL,
	`created_at` datetime(3) NOT NULL,
	`finished_at` datetime(3),
	CONSTRAINT `job_run_pk` PRIMARY KEY(`job`,`period`)
);
--> statement-breakpoint
CREATE TABLE `outbox_mail` (
	`id` varchar(36) NOT NULL,
	`tenant_id` varchar(36),
	`dedupe_key` varchar(160),
	`to_address` varchar(320) NOT NULL,
	`subject` varchar(200) NOT NULL,
	`body_text` text NOT NULL,
	`body_html` text NOT NULL,
	`attempts` int NOT NULL DEFAULT 0,
	`next_attempt_at` datetime(3) NOT NULL,
	`sent_at` datetime(3),
	`last_error` text,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `outbox_mail_id` PRIMARY KEY(`id`),
	CONSTRAINT `outbox_mail_dedupe_unique` UNIQUE(`dedupe_key`)
);
--> statement-breakpoint
CREATE TABLE `payment_event` (
	`id` varchar(80) NOT NULL,
	`type` varchar(80) NOT NULL,
	`account` varchar(64),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `payment_event_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `payment_setting` (
	`setting_key` varchar(120) NOT NULL,
	`value` varchar(200) NOT NULL,
	`secret` varchar(200),
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `payment_setting_setting_key` PRIMARY KEY(`setting_key`)
);
--> statement-breakpoint
ALTER TABLE `ticket` MODIFY COLUMN `payment` enum('credit','allocation','counter','no_charge') NOT NULL;--> statement-breakpoint
ALTER TABLE `customer` ADD `payment_customer_id` varchar(64);--> statement-breakpoint
ALTER TABLE `customer` ADD `notify_ready` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `customer` ADD `notify_reminders` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `ticket` ADD `credit_account_id` varchar(36);--> statement-breakpoint
ALTER TABLE `membership` ADD CONSTRAINT `membership_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `membership` ADD CONSTRAINT `membership_customer_fk` FOREIGN KEY (`tenant_id`,`customer_id`) REFERENCES `customer`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `membership` ADD CONSTRAINT `membership_product_fk` FOREIGN KEY (`tenant_id`,`product_id`) REFERENCES `product`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `payment` ADD CONSTRAINT `payment_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `payment` ADD CONSTRAINT `payment_customer_fk` FOREIGN KEY (`tenant_id`,`customer_id`) REFERENCES `customer`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `payment` ADD CONSTRAINT `payment_product_fk` FOREIGN KEY (`tenant_id`,`product_id`) REFERENCES `product`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `payment` ADD CONSTRAINT `payment_price_fk` FOREIGN KEY (`tenant_id`,`price_id`) REFERENCES `product_price`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `product` ADD CONSTRAINT `product_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `product_price` ADD CONSTRAINT `product_price_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `product_price` ADD CONSTRAINT `product_price_product_fk` FOREIGN KEY (`tenant_id`,`product_id`) REFERENCES `product`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `refund` ADD CONSTRAINT `refund_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `refund` ADD CONSTRAINT `refund_payment_fk` FOREIGN KEY (`tenant_id`,`payment_id`) REFERENCES `payment`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `rink_billing` ADD CONSTRAINT `rink_billing_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_account` ADD CONSTRAINT `credit_account_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_account` ADD CONSTRAINT `credit_account_customer_fk` FOREIGN KEY (`tenant_id`,`customer_id`) REFERENCES `customer`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_entry` ADD CONSTRAINT `credit_entry_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_entry` ADD CONSTRAINT `credit_entry_account_fk` FOREIGN KEY (`tenant_id`,`account_id`) REFERENCES `credit_account`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_entry` ADD CONSTRAINT `credit_entry_lot_fk` FOREIGN KEY (`tenant_id`,`lot_id`) REFERENCES `credit_lot`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_lot` ADD CONSTRAINT `credit_lot_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_lot` ADD CONSTRAINT `credit_lot_account_fk` FOREIGN KEY (`tenant_id`,`account_id`) REFERENCES `credit_account`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_lot` ADD CONSTRAINT `credit_lot_product_fk` FOREIGN KEY (`tenant_id`,`product_id`) REFERENCES `product`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_lot` ADD CONSTRAINT `credit_lot_payment_fk` FOREIGN KEY (`tenant_id`,`payment_id`) REFERENCES `payment`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `credit_lot` ADD CONSTRAINT `credit_lot_membership_fk` FOREIGN KEY (`tenant_id`,`membership_id`) REFERENCES `membership`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `league` ADD CONSTRAINT `league_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `league_player` ADD CONSTRAINT `league_player_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `league_player` ADD CONSTRAINT `league_player_league_fk` FOREIGN KEY (`tenant_id`,`league_id`) REFERENCES `league`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `league_player` ADD CONSTRAINT `league_player_team_fk` FOREIGN KEY (`tenant_id`,`team_id`) REFERENCES `league_team`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `league_player` ADD CONSTRAINT `league_player_customer_fk` FOREIGN KEY (`tenant_id`,`customer_id`) REFERENCES `customer`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `league_team` ADD CONSTRAINT `league_team_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `league_team` ADD CONSTRAINT `league_team_league_fk` FOREIGN KEY (`tenant_id`,`league_id`) REFERENCES `league`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `roster_import` ADD CONSTRAINT `roster_import_rink_fk` FOREIGN KEY (`tenant_id`) REFERENCES `rink`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `roster_import` ADD CONSTRAINT `roster_import_league_fk` FOREIGN KEY (`tenant_id`,`league_id`) REFERENCES `league`(`tenant_id`,`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `membership_tenant_customer_idx` ON `membership` (`tenant_id`,`customer_id`);--> statement-breakpoint
CREATE INDEX `membership_tenant_state_idx` ON `membership` (`tenant_id`,`state`);--> statement-breakpoint
CREATE INDEX `payment_tenant_customer_idx` ON `payment` (`tenant_id`,`customer_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `payment_tenant_paid_idx` ON `payment` (`tenant_id`,`paid_at`);--> statement-breakpoint
CREATE INDEX `product_tenant_kind_idx` ON `product` (`tenant_id`,`kind`,`active`);--> statement-breakpoint
CREATE INDEX `product_price_tenant_product_idx` ON `product_price` (`tenant_id`,`product_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `refund_tenant_payment_idx` ON `refund` (`tenant_id`,`payment_id`);--> statement-breakpoint
CREATE INDEX `credit_account_tenant_league_idx` ON `credit_account` (`tenant_id`,`league_id`);--> statement-breakpoint
CREATE INDEX `credit_entry_tenant_account_idx` ON `credit_entry` (`tenant_id`,`account_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `credit_entry_tenant_source_idx` ON `credit_entry` (`tenant_id`,`source`,`source_id`);--> statement-breakpoint
CREATE INDEX `credit_entry_tenant_kind_idx` ON `credit_entry` (`tenant_id`,`kind`,`created_at`);--> statement-breakpoint
CREATE INDEX `credit_entry_tenant_operation_idx` ON `credit_entry` (`tenant_id`,`operation_id`);--> statement-breakpoint
CREATE INDEX `credit_lot_tenant_account_idx` ON `credit_lot` (`tenant_id`,`account_id`,`expires_at`);--> statement-breakpoint
CREATE INDEX `credit_lot_tenant_expiry_idx` ON `credit_lot` (`tenant_id`,`expires_at`,`remaining`);--> statement-breakpoint
CREATE INDEX `credit_lot_tenant_payment_idx` ON `credit_lot` (`tenant_id`,`payment_id`);--> statement-breakpoint
CREATE INDEX `league_tenant_manager_idx` ON `league` (`tenant_id`,`manager_user_id`);--> statement-breakpoint
CREATE INDEX `league_player_tenant_team_idx` ON `league_player` (`tenant_id`,`team_id`);--> statement-breakpoint
CREATE INDEX `outbox_mail_due_idx` ON `outbox_mail` (`sent_at`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `payment_event_received_idx` ON `payment_event` (`created_at`);