ALTER TABLE "home_practice_sessions" ADD COLUMN "followed_up_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "home_practice_sessions" ADD COLUMN "followed_up_by" uuid;--> statement-breakpoint
ALTER TABLE "self_checks" ADD COLUMN "followed_up_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "self_checks" ADD COLUMN "followed_up_by" uuid;--> statement-breakpoint
ALTER TABLE "home_practice_sessions" ADD CONSTRAINT "home_practice_sessions_followed_up_by_users_id_fk" FOREIGN KEY ("followed_up_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "self_checks" ADD CONSTRAINT "self_checks_followed_up_by_users_id_fk" FOREIGN KEY ("followed_up_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;