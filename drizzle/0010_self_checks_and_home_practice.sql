CREATE TABLE "home_practice_reminders" (
	"client_id" uuid PRIMARY KEY NOT NULL,
	"next_due_on" date NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "home_practice_sessions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"client_id" uuid NOT NULL,
	"done_at" timestamp with time zone NOT NULL,
	"felt_ok" boolean NOT NULL,
	"note" text,
	"symptoms" text[] NOT NULL,
	"advice_level" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "home_practice_sessions_ok_without_symptoms" CHECK (not "home_practice_sessions"."felt_ok" or cardinality("home_practice_sessions"."symptoms") = 0)
);
--> statement-breakpoint
CREATE TABLE "home_practices" (
	"client_id" uuid PRIMARY KEY NOT NULL,
	"organisation_id" uuid NOT NULL,
	"items" jsonb NOT NULL,
	"set_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "self_check_sharing" (
	"client_id" uuid NOT NULL,
	"organisation_id" uuid NOT NULL,
	"shared" boolean NOT NULL,
	"changed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "self_check_sharing_client_id_organisation_id_pk" PRIMARY KEY("client_id","organisation_id")
);
--> statement-breakpoint
CREATE TABLE "self_checks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"client_id" uuid NOT NULL,
	"taken_at" timestamp with time zone NOT NULL,
	"symptoms" text[] NOT NULL,
	"sites" jsonb,
	"wound_healed" boolean,
	"advice_level" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "home_practice_reminders" ADD CONSTRAINT "home_practice_reminders_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "home_practice_sessions" ADD CONSTRAINT "home_practice_sessions_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "home_practices" ADD CONSTRAINT "home_practices_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "home_practices" ADD CONSTRAINT "home_practices_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "home_practices" ADD CONSTRAINT "home_practices_set_by_users_id_fk" FOREIGN KEY ("set_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "self_check_sharing" ADD CONSTRAINT "self_check_sharing_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "self_check_sharing" ADD CONSTRAINT "self_check_sharing_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "self_checks" ADD CONSTRAINT "self_checks_client_id_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."clients"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "home_practice_sessions_client_done_idx" ON "home_practice_sessions" USING btree ("client_id","done_at");--> statement-breakpoint
CREATE INDEX "self_checks_client_taken_idx" ON "self_checks" USING btree ("client_id","taken_at");