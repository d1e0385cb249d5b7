-- Sessions are now stored under the SHA-256 of their token; rows written before hold the raw token,
-- which no cookie can match any more. Ending them is the safe choice: everyone signs in once again.
DELETE FROM `sessions`;--> statement-breakpoint
-- Tokens made before expiry existed get the default lifetime, counted from their creation.
UPDATE `api_tokens` SET `expires_at` = strftime('%Y-%m-%dT%H:%M:%fZ', `created_at`, '+90 days') WHERE `expires_at` IS NULL;
