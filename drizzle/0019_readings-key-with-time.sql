-- drizzle-kit cannot name the old primary key: it is PostgreSQL's default for an inline one.
ALTER TABLE "readings" DROP CONSTRAINT "readings_pkey";--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_id_measured_at_pk" PRIMARY KEY("id","measured_at");
