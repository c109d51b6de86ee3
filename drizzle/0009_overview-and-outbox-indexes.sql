CREATE INDEX "reviews_version_status_idx" ON "reviews" USING btree ("version_id","status","board_id","weighted_total","rubric_template_id");--> statement-breakpoint
CREATE INDEX "outbox_messages_created_idx" ON "outbox_messages" USING btree ("created_at","id");--> statement-breakpoint
CREATE INDEX "outbox_messages_status_created_idx" ON "outbox_messages" USING btree ("status","created_at","id");