ALTER TABLE "shot" ADD COLUMN "published_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "shot" ADD COLUMN "published_by" text;--> statement-breakpoint
ALTER TABLE "team_settings" ADD COLUMN "auto_publish" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "shot" ADD CONSTRAINT "shot_published_by_user_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;