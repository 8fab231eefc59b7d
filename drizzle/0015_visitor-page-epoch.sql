CREATE TABLE "visitor_page_epoch" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"epoch" bigint DEFAULT 0 NOT NULL,
	CONSTRAINT "visitor_page_epoch_one_row" CHECK ("visitor_page_epoch"."id" = 1)
);
