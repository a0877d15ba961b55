-- Search matches a build's name and engine anywhere in them (ilike '%q%'): trigram indexes serve that.
-- pg_trgm is a trusted extension (PostgreSQL 13+): the database's owner creates it, no superuser needed.
CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
DROP INDEX "activity_build_time";--> statement-breakpoint
DROP INDEX "cutting_package_build";--> statement-breakpoint
DROP INDEX "degree_tape_build";--> statement-breakpoint
DROP INDEX "signal_check_build";--> statement-breakpoint
DROP INDEX "tdc_record_build";--> statement-breakpoint
DROP INDEX "wheel_photo_build";--> statement-breakpoint
CREATE INDEX "activity_build_newest" ON "activity" USING btree ("build_id","created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "build_workshop_updated" ON "build" USING btree ("workshop_id","updated_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "build_workshop_created" ON "build" USING btree ("workshop_id","created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "build_name_trgm" ON "build" USING gin ("name" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "build_engine_trgm" ON "build" USING gin ("engine" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "cutting_package_build_time" ON "cutting_package" USING btree ("build_id","created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "degree_tape_build_time" ON "degree_tape" USING btree ("build_id","created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "signal_check_build_time" ON "signal_check" USING btree ("build_id","created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "tdc_record_build_time" ON "tdc_record" USING btree ("build_id","created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "wheel_design_build_updated" ON "wheel_design" USING btree ("build_id","updated_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "wheel_photo_build_time" ON "wheel_photo" USING btree ("build_id","created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);