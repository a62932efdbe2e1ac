CREATE TABLE `customer_search` (
	`tenant_id` varchar(36) NOT NULL,
	`customer_id` varchar(36) NOT NULL,
	`position` smallint NOT NULL,
	`term` varchar(48) NOT NULL,
	CONSTRAINT `customer_search_pk` PRIMARY KEY(`tenant_id`,`customer_id`,`position`)
);
--> statement-breakpoint
ALTER TABLE `customer_search` ADD CONSTRAINT `customer_search_customer_fk` FOREIGN KEY (`tenant_id`,`customer_id`) REFERENCES `customer`(`tenant_id`,`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `customer_search_tenant_term_idx` ON `customer_search` (`tenant_id`,`term`);--> statement-breakpoint
INSERT INTO `customer_search` (`tenant_id`, `customer_id`, `position`, `term`)
WITH RECURSIVE `n` (`i`) AS (SELECT 1 UNION ALL SELECT `i` + 1 FROM `n` WHERE `i` < 320)
SELECT `c`.`tenant_id`, `c`.`id`, `n`.`i` - 1, LEFT(LOWER(SUBSTRING(`c`.`name`, `n`.`i`)), 48) FROM `customer` `c` JOIN `n` ON `n`.`i` <= CHAR_LENGTH(`c`.`name`)
UNION ALL
SELECT `c`.`tenant_id`, `c`.`id`, 1000 + `n`.`i` - 1, LEFT(LOWER(SUBSTRING(`c`.`email`, `n`.`i`)), 48) FROM `customer` `c` JOIN `n` ON `n`.`i` <= CHAR_LENGTH(`c`.`email`)
UNION ALL
SELECT `d`.`tenant_id`, `d`.`id`, 2000 + `n`.`i` - 1, SUBSTRING(`d`.`digits`, `n`.`i`)
  FROM (SELECT `tenant_id`, `id`, REGEXP_REPLACE(`phone`, '[^0-9]', '') AS `digits` FROM `customer` WHERE `phone` IS NOT NULL) `d`
  JOIN `n` ON `n`.`i` <= CHAR_LENGTH(`d`.`digits`) - 2
UNION ALL
SELECT `c`.`tenant_id`, `c`.`id`, 3000, LOWER(`c`.`member_code`) FROM `customer` `c`;
