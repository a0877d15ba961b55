-- A saved revision is history: refuse any UPDATE of it, whoever runs the statement.
CREATE FUNCTION wheel_revision_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	RAISE EXCEPTION 'wheel_revision rows are immutable; save a new revision instead' USING ERRCODE = 'P0001';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER wheel_revision_no_update BEFORE UPDATE ON wheel_revision FOR EACH ROW EXECUTE FUNCTION wheel_revision_immutable();
