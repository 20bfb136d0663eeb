CREATE TYPE "public"."document_share" AS ENUM('clinic', 'studio');--> statement-breakpoint
CREATE TABLE "documents" (
	"id" uuid PRIMARY KEY NOT NULL,
	"referral_id" uuid NOT NULL,
	"storage_key" text NOT NULL,
	"file_name" text NOT NULL,
	"share" "document_share" DEFAULT 'clinic' NOT NULL,
	"summary" text,
	"size_bytes" integer NOT NULL,
	"pages" integer NOT NULL,
	"sha256" text NOT NULL,
	"uploaded_by" uuid,
	"uploaded_at" timestamp (3) with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "documents_storage_key_unique" UNIQUE("storage_key"),
	CONSTRAINT "documents_size_limit" CHECK ("documents"."size_bytes" between 1 and 20971520),
	CONSTRAINT "documents_page_limit" CHECK ("documents"."pages" between 1 and 200),
	CONSTRAINT "documents_sha256_hex" CHECK ("documents"."sha256" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
ALTER TABLE "documents" ADD CONSTRAINT "documents_referral_id_referrals_id_fk" FOREIGN KEY ("referral_id") REFERENCES "public"."referrals"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "documents" ADD CONSTRAINT "documents_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "documents_referral_idx" ON "documents" USING btree ("referral_id","uploaded_at");