CREATE TABLE `rate_limit` (
	`key` varchar(255) NOT NULL,
	`points` int NOT NULL DEFAULT 0,
	`expire` bigint unsigned,
	CONSTRAINT `rate_limit_key` PRIMARY KEY(`key`)
);
