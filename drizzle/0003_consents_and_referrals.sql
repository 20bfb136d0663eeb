CREATE TYPE "public"."consent_event_kind" AS ENUM('given', 'withdrawn');--> statement-breakpoint
CREATE TYPE "public"."referral_state" AS ENUM('draft', 'sent', 'accepted', 'declined', 'assessed', 'closed', 'withdrawn');--> statement-breakpoint
CREATE TYPE "public"."referral_urgency" AS ENUM('routine', 'soon');--> statement-breakpoint
CREATE TABLE "consent_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"consent_id" uuid NOT NULL,
	"kind" "consent_event_kind" NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"actor_user_id" uuid
);
--> statement-breakpoint
CREATE TABLE "consent_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"client_id" uuid NOT NULL,
	"clinic_id" uuid NOT NULL,
	"requested_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"answered_at" timestamp with time zone,
	"consent_id" uuid
);
--> statement-breakpoint
CREATE TABLE "consents" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"client_id" uuid NOT NULL,
	"studio_id" uuid NOT NULL,
	"clinic_id" uuid NOT NULL,
	"scopes" text[] NOT NULL,
	"starts_at" timestamp with time zone NOT NULL,
	"ends_at" timestamp with time zone,
	"withdrawn_at" timestamp with time zone,
	"given_by" uuid,
	"withdrawn_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "consents_scopes_known" CHECK ("consents"."scopes" <@ array['referral','screenings','clearance','documents']::text[] and cardinality("consents"."scopes") > 0),
	CONSTRAINT "consents_ends_after_start" CHECK ("consents"."ends_at" is null or "consents"."ends_at" > "consents"."starts_at")
);
--> statement-breakpoint
CREATE TABLE "referral_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"referral_id" uuid NOT NULL,
	"from_state" "referral_state",
	"to_state" "referral_state" NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"actor_user_id" uuid,
	"actor_role" text,
	"reason" text
);
--> statement-breakpoint
CREATE TABLE "referral_list_views" (
	"user_id" uuid NOT NULL,
	"referral_id" uuid NOT NULL,
	"state" "referral_state" NOT NULL,
	"seen_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "referral_list_views_user_id_referral_id_pk" PRIMARY KEY("user_id","referral_id")
);
--> statement-breakpoint
CREATE TABLE "referral_snapshots" (
	"referral_id" uuid PRIMARY KEY NOT NULL,
	"taken_at" timestamp with time zone NOT NULL,
	"client" jsonb NOT NULL,
	"screenings" jsonb NOT NULL
);
--> statement-breakpoint
CREATE TABLE "referrals" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"client_id" uuid NOT NULL,
	"studio_id" uuid NOT NULL,
	"clinic_id" uuid NOT NULL,
	"physio_id" uuid,
	"created_by" uuid,
	"reason" text NOT NULL,
	"urgency" "referral_urgency" NOT NULL,
	"red_flags" text[] NOT NULL,
	"state" "referral_state" DEFAULT 'draft' NOT NULL,
	"created_at" timestamp (3) with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp (3) with time zone,
	"consent_id" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "referrals_sent_has_time" CHECK ("referrals"."state" in ('draft', 'withdrawn') or "referrals"."sent_at" is not null)
);
--> statement-breakpoint
ALTER TABLE "consent_events" ADD CONSTRAINT "consent_events_consent_id_consents_id_fk" FOREIGN KEY ("consent_id") REFERENCES "public"."consents"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consent_events" ADD CONSTRAINT "consent_events_actor_user_id_users_id_fk" FOREIGN KEY ("actor_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consent_requests" ADD CONSTRAINT "consent_requests_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consent_requests" ADD CONSTRAINT "consent_requests_clinic_id_organisations_id_fk" FOREIGN KEY ("clinic_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consent_requests" ADD CONSTRAINT "consent_requests_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consent_requests" ADD CONSTRAINT "consent_requests_consent_id_consents_id_fk" FOREIGN KEY ("consent_id") REFERENCES "public"."consents"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consents" ADD CONSTRAINT "consents_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consents" ADD CONSTRAINT "consents_studio_id_organisations_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consents" ADD CONSTRAINT "consents_clinic_id_organisations_id_fk" FOREIGN KEY ("clinic_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consents" ADD CONSTRAINT "consents_given_by_users_id_fk" FOREIGN KEY ("given_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "consents" ADD CONSTRAINT "consents_withdrawn_by_users_id_fk" FOREIGN KEY ("withdrawn_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referral_events" ADD CONSTRAINT "referral_events_referral_id_referrals_id_fk" FOREIGN KEY ("referral_id") REFERENCES "public"."referrals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referral_events" ADD CONSTRAINT "referral_events_actor_user_id_users_id_fk" FOREIGN KEY ("actor_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referral_list_views" ADD CONSTRAINT "referral_list_views_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referral_list_views" ADD CONSTRAINT "referral_list_views_referral_id_referrals_id_fk" FOREIGN KEY ("referral_id") REFERENCES "public"."referrals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referral_snapshots" ADD CONSTRAINT "referral_snapshots_referral_id_referrals_id_fk" FOREIGN KEY ("referral_id") REFERENCES "public"."referrals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_studio_id_organisations_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_clinic_id_organisations_id_fk" FOREIGN KEY ("clinic_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_physio_id_users_id_fk" FOREIGN KEY ("physio_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_consent_id_consents_id_fk" FOREIGN KEY ("consent_id") REFERENCES "public"."consents"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "consent_events_consent_idx" ON "consent_events" USING btree ("consent_id","at");--> statement-breakpoint
CREATE INDEX "consent_requests_client_idx" ON "consent_requests" USING btree ("client_id","created_at");--> statement-breakpoint
CREATE INDEX "consents_client_clinic_idx" ON "consents" USING btree ("client_id","clinic_id");--> statement-breakpoint
CREATE INDEX "consents_studio_idx" ON "consents" USING btree ("studio_id");--> statement-breakpoint
CREATE INDEX "consents_clinic_idx" ON "consents" USING btree ("clinic_id");--> statement-breakpoint
CREATE INDEX "referral_events_referral_idx" ON "referral_events" USING btree ("referral_id","id");--> statement-breakpoint
CREATE INDEX "referrals_studio_idx" ON "referrals" USING btree ("studio_id","created_at");--> statement-breakpoint
CREATE INDEX "referrals_clinic_idx" ON "referrals" USING btree ("clinic_id","sent_at");--> statement-breakpoint
CREATE INDEX "referrals_client_idx" ON "referrals" USING btree ("client_id");