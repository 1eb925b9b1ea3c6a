CREATE TABLE `estimates` (
	`id` integer PRIMARY KEY NOT NULL,
	`market_id` integer NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	`created_by` text NOT NULL,
	`app_version` text NOT NULL,
	`subject_json` text NOT NULL,
	`model_json` text NOT NULL,
	`sales_json` text NOT NULL,
	`result_json` text NOT NULL,
	FOREIGN KEY (`market_id`) REFERENCES `markets`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE INDEX `estimates_market_idx` ON `estimates` (`market_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `import_batches` (
	`id` integer PRIMARY KEY NOT NULL,
	`market_id` integer NOT NULL,
	`file_name` text NOT NULL,
	`status` text NOT NULL,
	`row_count` integer NOT NULL,
	`csv_text` text,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	`created_by` text NOT NULL,
	`committed_at` text,
	FOREIGN KEY (`market_id`) REFERENCES `markets`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `markets` (
	`id` integer PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`area_unit` text DEFAULT 'sqft' NOT NULL,
	`currency` text DEFAULT 'USD' NOT NULL,
	`notes` text,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `markets_name_unique` ON `markets` (`name`);--> statement-breakpoint
CREATE TABLE `sale_changes` (
	`id` integer PRIMARY KEY NOT NULL,
	`market_id` integer NOT NULL,
	`sale_id` integer NOT NULL,
	`at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	`by` text NOT NULL,
	`action` text NOT NULL,
	`before_json` text,
	`after_json` text,
	FOREIGN KEY (`market_id`) REFERENCES `markets`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `sale_changes_sale_idx` ON `sale_changes` (`sale_id`,`id`);--> statement-breakpoint
CREATE TABLE `sales` (
	`id` integer PRIMARY KEY NOT NULL,
	`market_id` integer NOT NULL,
	`ref` text NOT NULL,
	`address` text NOT NULL,
	`sale_date` text NOT NULL,
	`sale_price` real NOT NULL,
	`living_area` real,
	`year_built` integer,
	`rooms` integer,
	`bedrooms` integer,
	`bathrooms` real,
	`lot_area` real,
	`garage_spaces` integer,
	`verification` text,
	`notes` text,
	`included` integer DEFAULT true NOT NULL,
	`excluded_reason` text,
	`import_batch_id` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	`updated_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	FOREIGN KEY (`market_id`) REFERENCES `markets`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`import_batch_id`) REFERENCES `import_batches`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `sales_market_ref_unique` ON `sales` (`market_id`,`ref`);--> statement-breakpoint
CREATE INDEX `sales_market_date_idx` ON `sales` (`market_id`,`sale_date`);--> statement-breakpoint
CREATE TABLE `sessions` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` integer NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL,
	`expires_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `sessions_user_idx` ON `sessions` (`user_id`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` integer PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`password_hash` text NOT NULL,
	`salt` text NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_name_unique` ON `users` (`name`);