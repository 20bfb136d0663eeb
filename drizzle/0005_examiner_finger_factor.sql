ALTER TABLE "users" ADD COLUMN "mm_per_finger" real;--> statement-breakpoint
ALTER TABLE "users" ADD CONSTRAINT "users_mm_per_finger_range" CHECK ("users"."mm_per_finger" between 5 and 40);