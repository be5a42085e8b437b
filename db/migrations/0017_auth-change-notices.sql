-- Every change to what a signed-in request's session look-up reads (the session, its person,
-- the membership, the shop's name, the shop's settings) tells every instance of the app, which
-- forget the session look-ups they keep in memory (db/session-cache.ts). A statement-level
-- notice, sent only when its transaction commits; a new session changes no look-up kept.
CREATE FUNCTION fw_auth_changed() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM pg_notify('fw_auth_changed', TG_TABLE_NAME);
  RETURN NULL;
END $$;--> statement-breakpoint
CREATE TRIGGER session_changed_trg AFTER UPDATE OR DELETE OR TRUNCATE ON "session" FOR EACH STATEMENT EXECUTE FUNCTION fw_auth_changed();--> statement-breakpoint
CREATE TRIGGER user_changed_trg AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "user" FOR EACH STATEMENT EXECUTE FUNCTION fw_auth_changed();--> statement-breakpoint
CREATE TRIGGER member_changed_trg AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "member" FOR EACH STATEMENT EXECUTE FUNCTION fw_auth_changed();--> statement-breakpoint
CREATE TRIGGER organization_changed_trg AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "organization" FOR EACH STATEMENT EXECUTE FUNCTION fw_auth_changed();--> statement-breakpoint
CREATE TRIGGER shop_settings_changed_trg AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "shop_settings" FOR EACH STATEMENT EXECUTE FUNCTION fw_auth_changed();
