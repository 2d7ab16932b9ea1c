-- A deferring writer either has each new attempt noted in summary_pending (summary_deferral row 1) or adds
-- its new attempts to the summaries itself from the rows it wrote (row 2: a bulk import moving staged rows).
-- Either row switches the per-row insert trigger off; only row 1 notes.
DROP TRIGGER attempts_summary_pending;
--> statement-breakpoint
CREATE TRIGGER attempts_summary_pending AFTER INSERT ON attempts WHEN EXISTS (SELECT 1 FROM summary_deferral WHERE id = 1) BEGIN
  INSERT INTO summary_pending (id) VALUES (new.id);
END;
