CREATE TYPE "public"."client_stage" AS ENUM('pregnant', 'postpartum');--> statement-breakpoint
CREATE TYPE "public"."delivery_kind" AS ENUM('vaginal', 'caesarean');--> statement-breakpoint
CREATE TYPE "public"."intake_consent_method" AS ENUM('in_person', 'signed_form', 'online');--> statement-breakpoint
CREATE TYPE "public"."screening_outcome" AS ENUM('within_limit', 'monitor', 'refer');--> statement-breakpoint
CREATE TABLE "clients" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"user_id" uuid,
	"name" text NOT NULL,
	"email" text,
	"birth_year" integer,
	"stage" "client_stage" NOT NULL,
	"due_date" date,
	"birth_date" date,
	"delivery" "delivery_kind",
	"births" integer,
	"multiples" boolean,
	"postnatal_check_on" date,
	"postnatal_cleared" boolean,
	"notes" text,
	"intake_consent_at" timestamp with time zone,
	"intake_consent_method" "intake_consent_method",
	"intake_consent_taken_by" uuid,
	"last_screened_at" timestamp with time zone,
	"last_outcome" "screening_outcome",
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "clients_user_id_unique" UNIQUE("user_id"),
	CONSTRAINT "clients_email_lowercase" CHECK ("clients"."email" = lower("clients"."email")),
	CONSTRAINT "clients_stage_dates" CHECK (("clients"."stage" = 'pregnant' and "clients"."due_date" is not null) or ("clients"."stage" = 'postpartum' and "clients"."birth_date" is not null)),
	CONSTRAINT "clients_intake_consent_whole" CHECK (("clients"."intake_consent_at" is null) = ("clients"."intake_consent_method" is null))
);
--> statement-breakpoint
CREATE TABLE "screenings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"client_id" uuid NOT NULL,
	"taken_at" timestamp with time zone NOT NULL,
	"recorded_by" uuid,
	"sites" jsonb NOT NULL,
	"red_flags" text[] NOT NULL,
	"notes" text,
	"stage" "client_stage" NOT NULL,
	"weeks_postpartum" integer,
	"weeks_of_gestation" integer,
	"postnatal_check_done" boolean,
	"outcome" "screening_outcome" NOT NULL,
	"reasons" jsonb NOT NULL,
	"warnings" jsonb NOT NULL,
	"rules_version" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "clients" ADD CONSTRAINT "clients_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clients" ADD CONSTRAINT "clients_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clients" ADD CONSTRAINT "clients_intake_consent_taken_by_users_id_fk" FOREIGN KEY ("intake_consent_taken_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clients" ADD CONSTRAINT "clients_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "screenings" ADD CONSTRAINT "screenings_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "screenings" ADD CONSTRAINT "screenings_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "clients_org_name_idx" ON "clients" USING btree ("organisation_id","name");--> statement-breakpoint
CREATE INDEX "clients_org_last_screened_idx" ON "clients" USING btree ("organisation_id","last_screened_at");--> statement-breakpoint
CREATE INDEX "screenings_client_taken_idx" ON "screenings" USING btree ("client_id","taken_at");--> statement-breakpoint
-- The access log's subject-key map points at client records; erasing a client deletes her
-- map row (never a log row), so her past log rows can no longer be tied to her.
ALTER TABLE "subject_keys" ADD CONSTRAINT "subject_keys_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;
