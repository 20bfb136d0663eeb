ALTER TYPE "public"."outbox_state" ADD VALUE 'expired';--> statement-breakpoint
ALTER TYPE "public"."outbox_state" ADD VALUE 'superseded';--> statement-breakpoint
ALTER TABLE "outbox" ADD COLUMN "retry_from" timestamp with time zone DEFAULT now() NOT NULL;