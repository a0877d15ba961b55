CREATE TABLE "activity" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"actor_id" uuid,
	"kind" text NOT NULL,
	"summary" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "cutting_package" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"design_id" uuid,
	"revision" integer NOT NULL,
	"sent_to" text NOT NULL,
	"details" jsonb NOT NULL,
	"message_id" text,
	"sent_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "degree_tape" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"label" text DEFAULT '' NOT NULL,
	"params" jsonb NOT NULL,
	"author_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tdc_record" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"label" text DEFAULT '' NOT NULL,
	"params" jsonb NOT NULL,
	"tdc_deg" text NOT NULL,
	"author_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "wheel_design" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"name" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "wheel_design_build_name" UNIQUE("build_id","name")
);
--> statement-breakpoint
CREATE TABLE "wheel_photo" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"name" text NOT NULL,
	"mime" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"size_bytes" integer NOT NULL,
	"sha256" text NOT NULL,
	"storage_key" text NOT NULL,
	"thumbnail_key" text NOT NULL,
	"photo_reading" jsonb,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "wheel_photo_storage_key_unique" UNIQUE("storage_key"),
	CONSTRAINT "wheel_photo_thumbnail_key_unique" UNIQUE("thumbnail_key")
);
--> statement-breakpoint
CREATE TABLE "wheel_revision" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"design_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"params" jsonb NOT NULL,
	"message" text DEFAULT '' NOT NULL,
	"restored_from" integer,
	"author_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "wheel_revision_design_number" UNIQUE("design_id","number"),
	CONSTRAINT "wheel_revision_number_positive" CHECK ("wheel_revision"."number" >= 1)
);
--> statement-breakpoint
ALTER TABLE "build" ADD COLUMN "engine_profile" jsonb;--> statement-breakpoint
ALTER TABLE "activity" ADD CONSTRAINT "activity_build_id_build_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "activity" ADD CONSTRAINT "activity_actor_id_user_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cutting_package" ADD CONSTRAINT "cutting_package_build_id_build_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cutting_package" ADD CONSTRAINT "cutting_package_design_id_wheel_design_id_fk" FOREIGN KEY ("design_id") REFERENCES "public"."wheel_design"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cutting_package" ADD CONSTRAINT "cutting_package_sent_by_user_id_fk" FOREIGN KEY ("sent_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "degree_tape" ADD CONSTRAINT "degree_tape_build_id_build_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "degree_tape" ADD CONSTRAINT "degree_tape_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tdc_record" ADD CONSTRAINT "tdc_record_build_id_build_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tdc_record" ADD CONSTRAINT "tdc_record_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wheel_design" ADD CONSTRAINT "wheel_design_build_id_build_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wheel_photo" ADD CONSTRAINT "wheel_photo_build_id_build_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wheel_photo" ADD CONSTRAINT "wheel_photo_uploaded_by_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wheel_revision" ADD CONSTRAINT "wheel_revision_design_id_wheel_design_id_fk" FOREIGN KEY ("design_id") REFERENCES "public"."wheel_design"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "wheel_revision" ADD CONSTRAINT "wheel_revision_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "activity_build_time" ON "activity" USING btree ("build_id","created_at");--> statement-breakpoint
CREATE INDEX "cutting_package_build" ON "cutting_package" USING btree ("build_id");--> statement-breakpoint
CREATE INDEX "degree_tape_build" ON "degree_tape" USING btree ("build_id");--> statement-breakpoint
CREATE INDEX "tdc_record_build" ON "tdc_record" USING btree ("build_id");--> statement-breakpoint
CREATE INDEX "wheel_photo_build" ON "wheel_photo" USING btree ("build_id");