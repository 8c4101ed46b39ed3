ALTER TABLE "events" ALTER COLUMN "area" SET DATA TYPE geometry(Geometry,4326);--> statement-breakpoint
ALTER TABLE "zones" ALTER COLUMN "geom" SET DATA TYPE geometry(Geometry,4326);--> statement-breakpoint
ALTER TABLE "events" ADD CONSTRAINT "events_area_areal" CHECK ("events"."area" IS NULL OR GeometryType("events"."area") IN ('POLYGON', 'MULTIPOLYGON'));--> statement-breakpoint
ALTER TABLE "zones" ADD CONSTRAINT "zones_geom_areal" CHECK (GeometryType("zones"."geom") IN ('POLYGON', 'MULTIPOLYGON'));