DROP INDEX "access_log_at_idx";--> statement-breakpoint
DROP INDEX "access_log_subject_idx";--> statement-breakpoint
DROP INDEX "access_log_actor_org_idx";--> statement-breakpoint
CREATE INDEX "access_log_at_id_idx" ON "access_log" USING btree ("at","id");--> statement-breakpoint
CREATE INDEX "access_log_subject_at_idx" ON "access_log" USING btree ("subject_key","at","id");--> statement-breakpoint
CREATE INDEX "access_log_actor_org_at_idx" ON "access_log" USING btree ("actor_organisation_id","at","id");--> statement-breakpoint
CREATE INDEX "access_log_actor_at_idx" ON "access_log" USING btree ("actor_user_id","at","id");--> statement-breakpoint
CREATE INDEX "access_log_target_at_idx" ON "access_log" USING btree ("target_type","target_id","at","id");--> statement-breakpoint
CREATE INDEX "access_log_action_at_idx" ON "access_log" USING btree ("action","at","id");--> statement-breakpoint
CREATE INDEX "access_log_outcome_at_idx" ON "access_log" USING btree ("outcome","at","id");