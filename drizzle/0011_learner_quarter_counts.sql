CREATE TABLE `learner_quarter_counts` (
	`quarter` text NOT NULL,
	`prev_quarter` text NOT NULL,
	`prev_pass_quarter` text NOT NULL,
	`learners` integer NOT NULL,
	`first_passed` integer NOT NULL,
	`with_pass` integer NOT NULL,
	PRIMARY KEY(`quarter`, `prev_quarter`, `prev_pass_quarter`)
);
--> statement-breakpoint
-- Each learner_quarters row counted once under its quarter and previous quarters, in the transaction that
-- writes it: insert adds, delete subtracts, an update (attempts added by an import, a previous quarter moved by
-- an earlier quarter's change) subtracts the old row and adds the new one.
CREATE TRIGGER learner_quarter_counts_insert AFTER INSERT ON learner_quarters BEGIN
  INSERT INTO learner_quarter_counts (quarter, prev_quarter, prev_pass_quarter, learners, first_passed, with_pass)
  VALUES (new.quarter, coalesce(new.prev_quarter, ''), coalesce(new.prev_pass_quarter, ''), 1, new.first_passed, new.passed > 0)
  ON CONFLICT (quarter, prev_quarter, prev_pass_quarter) DO UPDATE SET learners = learners + excluded.learners,
    first_passed = first_passed + excluded.first_passed, with_pass = with_pass + excluded.with_pass;
END;
--> statement-breakpoint
CREATE TRIGGER learner_quarter_counts_delete AFTER DELETE ON learner_quarters BEGIN
  UPDATE learner_quarter_counts SET learners = learners - 1, first_passed = first_passed - old.first_passed, with_pass = with_pass - (old.passed > 0)
  WHERE quarter = old.quarter AND prev_quarter = coalesce(old.prev_quarter, '') AND prev_pass_quarter = coalesce(old.prev_pass_quarter, '');
  DELETE FROM learner_quarter_counts WHERE quarter = old.quarter AND prev_quarter = coalesce(old.prev_quarter, '')
    AND prev_pass_quarter = coalesce(old.prev_pass_quarter, '') AND learners = 0;
END;
--> statement-breakpoint
CREATE TRIGGER learner_quarter_counts_update AFTER UPDATE OF quarter, prev_quarter, prev_pass_quarter, passed, first_passed ON learner_quarters
  WHEN old.quarter IS NOT new.quarter OR old.prev_quarter IS NOT new.prev_quarter OR old.prev_pass_quarter IS NOT new.prev_pass_quarter
    OR (old.passed > 0) IS NOT (new.passed > 0) OR old.first_passed IS NOT new.first_passed
BEGIN
  UPDATE learner_quarter_counts SET learners = learners - 1, first_passed = first_passed - old.first_passed, with_pass = with_pass - (old.passed > 0)
  WHERE quarter = old.quarter AND prev_quarter = coalesce(old.prev_quarter, '') AND prev_pass_quarter = coalesce(old.prev_pass_quarter, '');
  DELETE FROM learner_quarter_counts WHERE quarter = old.quarter AND prev_quarter = coalesce(old.prev_quarter, '')
    AND prev_pass_quarter = coalesce(old.prev_pass_quarter, '') AND learners = 0;
  INSERT INTO learner_quarter_counts (quarter, prev_quarter, prev_pass_quarter, learners, first_passed, with_pass)
  VALUES (new.quarter, coalesce(new.prev_quarter, ''), coalesce(new.prev_pass_quarter, ''), 1, new.first_passed, new.passed > 0)
  ON CONFLICT (quarter, prev_quarter, prev_pass_quarter) DO UPDATE SET learners = learners + excluded.learners,
    first_passed = first_passed + excluded.first_passed, with_pass = with_pass + excluded.with_pass;
END;
--> statement-breakpoint
-- learner quarters already stored
INSERT INTO learner_quarter_counts (quarter, prev_quarter, prev_pass_quarter, learners, first_passed, with_pass)
SELECT quarter, coalesce(prev_quarter, ''), coalesce(prev_pass_quarter, ''), count(*), sum(first_passed), sum(passed > 0)
FROM learner_quarters GROUP BY quarter, coalesce(prev_quarter, ''), coalesce(prev_pass_quarter, '');
