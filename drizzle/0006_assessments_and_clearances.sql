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
CREATE INDEX "assessments_referral_idx" ON "assessments" USING btree ("referral_id","recorded_at");--> statement-breakpoint
CREATE INDEX "clearances_client_idx" ON "clearances" USING btree ("client_id","set_at");--> statement-breakpoint
CREATE INDEX "clearances_review_idx" ON "clearances" USING btree ("review_on");--> statement-breakpoint
CREATE UNIQUE INDEX "clearances_supersedes_unique" ON "clearances" USING btree ("supersedes");