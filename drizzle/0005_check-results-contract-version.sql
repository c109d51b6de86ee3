ALTER TABLE "check_results" ADD COLUMN "contract_version" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "check_results" ADD COLUMN "tolerance" jsonb;