CREATE TYPE "public"."erasure_state" AS ENUM('open', 'approved', 'declined');--> statement-breakpoint
CREATE TABLE "erasure_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"client_id" uuid,
	"requested_by" uuid,
	"requested_at" timestamp (3) with time zone DEFAULT now() NOT NULL,
	"due_on" date NOT NULL,
	"state" "erasure_state" DEFAULT 'open' NOT NULL,
	"decided_by" uuid,
	"decided_at" timestamp with time zone,
	"reason" text,
	"erased" text,
	CONSTRAINT "erasure_requests_decided_whole" CHECK (("erasure_requests"."state" = 'open') = ("erasure_requests"."decided_at" is null)),
	CONSTRAINT "erasure_requests_decline_has_reason" CHECK ("erasure_requests"."state" <> 'declined' or ("erasure_requests"."reason" is not null and length("erasure_requests"."reason") > 0)),
	CONSTRAINT "erasure_requests_approved_detached" CHECK ("erasure_requests"."state" <> 'approved' or "erasure_requests"."client_id" is null)
);
--> statement-breakpoint
ALTER TABLE "referrals" DROP CONSTRAINT "referrals_client_id_clients_id_fk";
--> statement-breakpoint
ALTER TABLE "assessments" DROP CONSTRAINT "assessments_client_id_clients_id_fk";
--> statement-breakpoint
ALTER TABLE "clearances" DROP CONSTRAINT "clearances_client_id_clients_id_fk";
--> statement-breakpoint
ALTER TABLE "referrals" ALTER COLUMN "client_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "assessments" ALTER COLUMN "client_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "clearances" ALTER COLUMN "client_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "referrals" ADD COLUMN "studio_erased_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "erasure_requests" ADD CONSTRAINT "erasure_requests_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "erasure_requests" ADD CONSTRAINT "erasure_requests_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "erasure_requests" ADD CONSTRAINT "erasure_requests_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "erasure_requests" ADD CONSTRAINT "erasure_requests_decided_by_users_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "erasure_requests_org_idx" ON "erasure_requests" USING btree ("organisation_id","state","due_on");--> statement-breakpoint
CREATE UNIQUE INDEX "erasure_requests_one_open" ON "erasure_requests" USING btree ("client_id") WHERE "erasure_requests"."state" = 'open';--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assessments" ADD CONSTRAINT "assessments_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clearances" ADD CONSTRAINT "clearances_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "referrals" ADD CONSTRAINT "referrals_erased_were_sent" CHECK ("referrals"."studio_erased_at" is null or ("referrals"."client_id" is null and "referrals"."sent_at" is not null));