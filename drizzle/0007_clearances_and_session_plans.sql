CREATE TYPE "public"."hernia_finding" AS ENUM('none', 'suspected', 'found');--> statement-breakpoint
CREATE TABLE "assessments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"referral_id" uuid NOT NULL,
	"client_id" uuid NOT NULL,
	"clinic_id" uuid NOT NULL,
	"points" jsonb NOT NULL,
	"hernia" "hernia_finding" NOT NULL,
	"pelvic_floor" text,
	"plan" text NOT NULL,
	"recorded_by" uuid,
	"recorded_at" timestamp (3) with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "assessments_has_points" CHECK (jsonb_array_length("assessments"."points") > 0)
);
--> statement-breakpoint
CREATE TABLE "clearances" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"client_id" uuid NOT NULL,
	"clinic_id" uuid NOT NULL,
	"referral_id" uuid,
	"levels" jsonb NOT NULL,
	"modifications" jsonb NOT NULL,
	"notes" text,
	"review_on" date NOT NULL,
	"set_by" uuid,
	"set_at" timestamp (3) with time zone DEFAULT now() NOT NULL,
	"stage_at_set" "client_stage" NOT NULL,
	"known_until" timestamp (3) with time zone NOT NULL,
	"supersedes" uuid,
	"sharing_ended_on" date,
	"reminder_sent_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "clearance_review_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"client_id" uuid NOT NULL,
	"studio_id" uuid NOT NULL,
	"clinic_id" uuid NOT NULL,
	"clearance_id" uuid,
	"exercise_id" text,
	"note" text NOT NULL,
	"requested_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"seen_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "plan_clients" (
	"plan_id" uuid NOT NULL,
	"client_id" uuid NOT NULL,
	"position" integer NOT NULL,
	CONSTRAINT "plan_clients_plan_id_client_id_pk" PRIMARY KEY("plan_id","client_id")
);
--> statement-breakpoint
CREATE TABLE "plan_overrides" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"plan_id" uuid NOT NULL,
	"plan_version" integer NOT NULL,
	"reason" text NOT NULL,
	"cells" jsonb NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "plans" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"title" text NOT NULL,
	"scheduled_for" timestamp with time zone,
	"items" jsonb NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"ready_at" timestamp with time zone,
	"ready_by" uuid,
	"ready_check" jsonb,
	"archived_at" timestamp with time zone,
	"created_by" uuid,
	"updated_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "plans_items_max" CHECK (jsonb_array_length("plans"."items") <= 60),
	CONSTRAINT "plans_version_positive" CHECK ("plans"."version" >= 1)
);
--> statement-breakpoint
CREATE TABLE "studio_exercises" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"slug" text NOT NULL,
	"name" text NOT NULL,
	"description" text NOT NULL,
	"position" text NOT NULL,
	"difficulty" integer NOT NULL,
	"categories" jsonb NOT NULL,
	"alternative_ids" jsonb NOT NULL,
	"why" text DEFAULT '' NOT NULL,
	"copied_from" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "studio_exercises_difficulty" CHECK ("studio_exercises"."difficulty" between 1 and 3),
	CONSTRAINT "studio_exercises_has_category" CHECK (jsonb_array_length("studio_exercises"."categories") > 0)
);
--> statement-breakpoint
ALTER TABLE "screenings" ADD COLUMN "medical_sign_resolved" boolean;--> statement-breakpoint
ALTER TABLE "assessments" ADD CONSTRAINT "assessments_referral_id_referrals_id_fk" FOREIGN KEY ("referral_id") REFERENCES "public"."referrals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assessments" ADD CONSTRAINT "assessments_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assessments" ADD CONSTRAINT "assessments_clinic_id_organisations_id_fk" FOREIGN KEY ("clinic_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assessments" ADD CONSTRAINT "assessments_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearances" ADD CONSTRAINT "clearances_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearances" ADD CONSTRAINT "clearances_clinic_id_organisations_id_fk" FOREIGN KEY ("clinic_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearances" ADD CONSTRAINT "clearances_referral_id_referrals_id_fk" FOREIGN KEY ("referral_id") REFERENCES "public"."referrals"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearances" ADD CONSTRAINT "clearances_set_by_users_id_fk" FOREIGN KEY ("set_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearances" ADD CONSTRAINT "clearances_supersedes_clearances_id_fk" FOREIGN KEY ("supersedes") REFERENCES "public"."clearances"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearance_review_requests" ADD CONSTRAINT "clearance_review_requests_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearance_review_requests" ADD CONSTRAINT "clearance_review_requests_studio_id_organisations_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearance_review_requests" ADD CONSTRAINT "clearance_review_requests_clinic_id_organisations_id_fk" FOREIGN KEY ("clinic_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearance_review_requests" ADD CONSTRAINT "clearance_review_requests_clearance_id_clearances_id_fk" FOREIGN KEY ("clearance_id") REFERENCES "public"."clearances"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearance_review_requests" ADD CONSTRAINT "clearance_review_requests_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_clients" ADD CONSTRAINT "plan_clients_plan_id_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."plans"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_clients" ADD CONSTRAINT "plan_clients_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_overrides" ADD CONSTRAINT "plan_overrides_plan_id_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."plans"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_overrides" ADD CONSTRAINT "plan_overrides_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_ready_by_users_id_fk" FOREIGN KEY ("ready_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "studio_exercises" ADD CONSTRAINT "studio_exercises_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "studio_exercises" ADD CONSTRAINT "studio_exercises_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "assessments_referral_idx" ON "assessments" USING btree ("referral_id","recorded_at");--> statement-breakpoint
CREATE INDEX "clearances_client_idx" ON "clearances" USING btree ("client_id","set_at");--> statement-breakpoint
CREATE INDEX "clearances_review_idx" ON "clearances" USING btree ("review_on");--> statement-breakpoint
CREATE UNIQUE INDEX "clearances_supersedes_unique" ON "clearances" USING btree ("supersedes");--> statement-breakpoint
CREATE INDEX "clearance_review_requests_clinic_idx" ON "clearance_review_requests" USING btree ("clinic_id","created_at");--> statement-breakpoint
CREATE INDEX "plan_clients_client_idx" ON "plan_clients" USING btree ("client_id");--> statement-breakpoint
CREATE INDEX "plan_overrides_plan_idx" ON "plan_overrides" USING btree ("plan_id","created_at");--> statement-breakpoint
CREATE INDEX "plans_org_updated_idx" ON "plans" USING btree ("organisation_id","updated_at");--> statement-breakpoint
CREATE UNIQUE INDEX "studio_exercises_org_slug_idx" ON "studio_exercises" USING btree ("organisation_id","slug");