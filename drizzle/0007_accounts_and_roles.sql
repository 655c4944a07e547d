-- Custom migration (drizzle-kit generate --custom): data fixes and CHECK constraints on
-- better-auth's own tables, which drizzle-kit cannot express without hand-editing the schema
-- file better-auth's CLI generates (server/db/auth-schema.ts).
--
-- 1. A member's or an invitation's role is exactly one of the product's roles. The auth library's
--    team routes (closed since, docs/decisions/111) could store a list such as "player,admin",
--    which the product read as player and the library as admin. Each list becomes its first
--    role, which is what the product showed, and the database refuses lists from now on.
UPDATE "member" SET "role" = btrim(split_part("role", ',', 1)) WHERE "role" LIKE '%,%';--> statement-breakpoint
UPDATE "invitation" SET "role" = btrim(split_part("role", ',', 1)) WHERE "role" LIKE '%,%';--> statement-breakpoint
UPDATE "member" SET "role" = 'player' WHERE "role" NOT IN ('admin', 'coach', 'analyst', 'player');--> statement-breakpoint
ALTER TABLE "member" ADD CONSTRAINT "member_role_single" CHECK ("role" IN ('admin', 'coach', 'analyst', 'player'));--> statement-breakpoint
ALTER TABLE "invitation" ADD CONSTRAINT "invitation_role_single" CHECK ("role" IS NULL OR "role" IN ('admin', 'coach', 'analyst', 'player'));--> statement-breakpoint
-- 2. An account that belongs to a team got there by opening an invitation mailed to its address
--    (or is demo data): its address counts as proved. Accounts with no team may have been made by
--    anyone through the open sign-up (closed since, docs/decisions/110); they stay unproved until
--    a password reset proves them.
UPDATE "user" SET "email_verified" = true WHERE "id" IN (SELECT "user_id" FROM "member");
