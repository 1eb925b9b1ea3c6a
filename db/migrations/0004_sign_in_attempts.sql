CREATE TABLE `sign_in_attempts` (
	`id` integer PRIMARY KEY NOT NULL,
	`at` text NOT NULL,
	`user_name` text NOT NULL,
	`address` text NOT NULL,
	`succeeded` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `sign_in_attempts_user_idx` ON `sign_in_attempts` (`user_name`,`at`);--> statement-breakpoint
CREATE INDEX `sign_in_attempts_address_idx` ON `sign_in_attempts` (`address`,`at`);