-- Appends events to one audit chain (a workspace's, or the global one when chain_workspace is
-- null) in a single round trip: takes the chain's transaction-scoped advisory lock, reads the
-- chain's last hash with a fresh snapshot (each statement of a volatile function in READ
-- COMMITTED gets its own), then inserts the events in the order given, each hashed as
--   hex(SHA-256(previous hash || '\n' || content))
-- where content is the event's canonical JSON that the app computed (src/lib/server/audit/
-- chain.ts, eventContent), so the app's chain check recomputes exactly these hashes.
-- events: a JSON array of { actorId, action, subject, payload, createdAt, content }.
CREATE FUNCTION audit_append(chain_workspace uuid, events jsonb)
RETURNS TABLE (event_id bigint, event_hash text)
LANGUAGE plpgsql VOLATILE AS $$
DECLARE
	head text;
	event jsonb;
BEGIN
	PERFORM pg_advisory_xact_lock(
		hashtextextended('pincer.audit:' || coalesce(chain_workspace::text, 'global'), 0)
	);
	IF chain_workspace IS NULL THEN
		SELECT a.hash INTO head FROM audit_events a
		WHERE a.workspace_id IS NULL ORDER BY a.id DESC LIMIT 1;
	ELSE
		SELECT a.hash INTO head FROM audit_events a
		WHERE a.workspace_id = chain_workspace ORDER BY a.id DESC LIMIT 1;
	END IF;
	head := coalesce(head, '');
	FOR event IN
		SELECT e.value FROM jsonb_array_elements(events) WITH ORDINALITY AS e(value, n) ORDER BY e.n
	LOOP
		event_hash := encode(sha256(convert_to(head || E'\n' || (event->>'content'), 'UTF8')), 'hex');
		INSERT INTO audit_events
			(workspace_id, actor_id, action, subject, payload, created_at, prev_hash, hash)
		VALUES (
			chain_workspace,
			(event->>'actorId')::uuid,
			event->>'action',
			event->>'subject',
			coalesce(event->'payload', '{}'::jsonb),
			(event->>'createdAt')::timestamptz,
			head,
			event_hash
		)
		RETURNING audit_events.id INTO event_id;
		RETURN NEXT;
		head := event_hash;
	END LOOP;
END
$$;
