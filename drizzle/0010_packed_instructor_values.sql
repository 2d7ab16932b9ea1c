CREATE TABLE `instructor_values` (
	`quarter` text NOT NULL,
	`instructor_id` integer NOT NULL,
	`attempts` integer NOT NULL,
	`tallies` blob NOT NULL,
	`cells` blob NOT NULL,
	`packed_score` blob NOT NULL,
	`packed_depth_ok_pct` blob NOT NULL,
	`packed_rate_ok_pct` blob NOT NULL,
	`packed_recoil_ok_pct` blob NOT NULL,
	`packed_hands_on_pct` blob NOT NULL,
	PRIMARY KEY(`quarter`, `instructor_id`)
);
--> statement-breakpoint
CREATE TABLE `instructor_values_stale` (
	`quarter` text NOT NULL,
	`instructor_id` integer NOT NULL,
	PRIMARY KEY(`quarter`, `instructor_id`)
);
--> statement-breakpoint
-- Per-instructor distributions move from one row per attempt, metric and group (attempt_values) to one packed
-- row per instructor and quarter (instructor_values). The per-row triggers no longer count values; they note
-- the instructor-quarter whose attempts changed, and the writing service rebuilds it before it commits.
DROP TRIGGER attempts_tally_insert;
--> statement-breakpoint
DROP TRIGGER attempts_tally_delete;
--> statement-breakpoint
DROP TRIGGER attempts_values_update;
--> statement-breakpoint
CREATE TRIGGER attempts_tally_insert AFTER INSERT ON attempts WHEN NOT EXISTS (SELECT 1 FROM summary_deferral) BEGIN
  INSERT INTO attempt_tallies (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.policy_version, 1, new.passed, (new.instructor_result IS 'pass' AND new.passed = 1), (new.instructor_result IS 'pass' AND new.passed = 0), (new.instructor_result IS 'fail' AND new.passed = 1), (new.instructor_result IS 'fail' AND new.passed = 0), (new.error_mask != 0), new.compressions, ((new.error_mask >> 0) & 1), ((new.error_mask >> 1) & 1), ((new.error_mask >> 2) & 1), ((new.error_mask >> 3) & 1), ((new.error_mask >> 4) & 1), ((new.error_mask >> 5) & 1), ((new.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
  INSERT INTO network_tallies (quarter, profile, feedback, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (new.quarter, new.profile, new.feedback, new.policy_version, 1, new.passed, (new.instructor_result IS 'pass' AND new.passed = 1), (new.instructor_result IS 'pass' AND new.passed = 0), (new.instructor_result IS 'fail' AND new.passed = 1), (new.instructor_result IS 'fail' AND new.passed = 0), (new.error_mask != 0), new.compressions, ((new.error_mask >> 0) & 1), ((new.error_mask >> 1) & 1), ((new.error_mask >> 2) & 1), ((new.error_mask >> 3) & 1), ((new.error_mask >> 4) & 1), ((new.error_mask >> 5) & 1), ((new.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
  INSERT INTO network_values (metric, quarter, profile, feedback, value, count)
  VALUES
    ('score', new.quarter, new.profile, new.feedback, new.score, 1),
    ('depth_ok_pct', new.quarter, new.profile, new.feedback, new.depth_ok_pct, 1),
    ('rate_ok_pct', new.quarter, new.profile, new.feedback, new.rate_ok_pct, 1),
    ('recoil_ok_pct', new.quarter, new.profile, new.feedback, new.recoil_ok_pct, 1),
    ('hands_on_pct', new.quarter, new.profile, new.feedback, new.hands_on_pct, 1)
  ON CONFLICT (metric, quarter, profile, feedback, value) DO UPDATE SET count = count + excluded.count;
  INSERT INTO learner_tallies (quarter, learner, profile, feedback, site_id, instructor_id, manikin_id, attempts, passed, first_started, first_id, first_passed)
  VALUES (new.quarter, new.learner, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), 1, new.passed, new.started_at, new.id, new.passed)
  ON CONFLICT (quarter, learner, profile, feedback, site_id, instructor_id, manikin_id) DO UPDATE SET attempts = attempts + 1, passed = passed + excluded.passed,
    first_passed = CASE WHEN (excluded.first_started, excluded.first_id) < (first_started, first_id) THEN excluded.first_passed ELSE first_passed END,
    first_started = CASE WHEN (excluded.first_started, excluded.first_id) < (first_started, first_id) THEN excluded.first_started ELSE first_started END,
    first_id = CASE WHEN (excluded.first_started, excluded.first_id) < (first_started, first_id) THEN excluded.first_id ELSE first_id END;
  INSERT INTO learner_quarters (quarter, learner, attempts, passed, first_started, first_id, first_passed)
  VALUES (new.quarter, new.learner, 1, new.passed, new.started_at, new.id, new.passed)
  ON CONFLICT (quarter, learner) DO UPDATE SET attempts = attempts + 1, passed = passed + excluded.passed,
    first_passed = CASE WHEN (excluded.first_started, excluded.first_id) < (first_started, first_id) THEN excluded.first_passed ELSE first_passed END,
    first_started = CASE WHEN (excluded.first_started, excluded.first_id) < (first_started, first_id) THEN excluded.first_started ELSE first_started END,
    first_id = CASE WHEN (excluded.first_started, excluded.first_id) < (first_started, first_id) THEN excluded.first_id ELSE first_id END;
  INSERT OR IGNORE INTO instructor_values_stale (quarter, instructor_id) VALUES (new.quarter, new.instructor_id);
END;
--> statement-breakpoint
CREATE TRIGGER attempts_tally_delete AFTER DELETE ON attempts WHEN old.id NOT IN (SELECT id FROM summary_pending) BEGIN
  INSERT INTO attempt_tallies (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.policy_version, -1, -old.passed, -(old.instructor_result IS 'pass' AND old.passed = 1), -(old.instructor_result IS 'pass' AND old.passed = 0), -(old.instructor_result IS 'fail' AND old.passed = 1), -(old.instructor_result IS 'fail' AND old.passed = 0), -(old.error_mask != 0), -old.compressions, -((old.error_mask >> 0) & 1), -((old.error_mask >> 1) & 1), -((old.error_mask >> 2) & 1), -((old.error_mask >> 3) & 1), -((old.error_mask >> 4) & 1), -((old.error_mask >> 5) & 1), -((old.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
  DELETE FROM attempt_tallies WHERE quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND policy_version = old.policy_version AND n = 0;
  INSERT INTO network_tallies (quarter, profile, feedback, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (old.quarter, old.profile, old.feedback, old.policy_version, -1, -old.passed, -(old.instructor_result IS 'pass' AND old.passed = 1), -(old.instructor_result IS 'pass' AND old.passed = 0), -(old.instructor_result IS 'fail' AND old.passed = 1), -(old.instructor_result IS 'fail' AND old.passed = 0), -(old.error_mask != 0), -old.compressions, -((old.error_mask >> 0) & 1), -((old.error_mask >> 1) & 1), -((old.error_mask >> 2) & 1), -((old.error_mask >> 3) & 1), -((old.error_mask >> 4) & 1), -((old.error_mask >> 5) & 1), -((old.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
  DELETE FROM network_tallies WHERE quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND policy_version = old.policy_version AND n = 0;
  INSERT INTO network_values (metric, quarter, profile, feedback, value, count)
  VALUES
    ('score', old.quarter, old.profile, old.feedback, old.score, -1),
    ('depth_ok_pct', old.quarter, old.profile, old.feedback, old.depth_ok_pct, -1),
    ('rate_ok_pct', old.quarter, old.profile, old.feedback, old.rate_ok_pct, -1),
    ('recoil_ok_pct', old.quarter, old.profile, old.feedback, old.recoil_ok_pct, -1),
    ('hands_on_pct', old.quarter, old.profile, old.feedback, old.hands_on_pct, -1)
  ON CONFLICT (metric, quarter, profile, feedback, value) DO UPDATE SET count = count + excluded.count;
  DELETE FROM network_values WHERE metric = 'score' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.score AND count = 0;
  DELETE FROM network_values WHERE metric = 'depth_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.depth_ok_pct AND count = 0;
  DELETE FROM network_values WHERE metric = 'rate_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.rate_ok_pct AND count = 0;
  DELETE FROM network_values WHERE metric = 'recoil_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.recoil_ok_pct AND count = 0;
  DELETE FROM network_values WHERE metric = 'hands_on_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.hands_on_pct AND count = 0;
  DELETE FROM learner_tallies WHERE quarter = old.quarter AND learner = old.learner AND profile = old.profile AND feedback = old.feedback
    AND site_id = old.site_id AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0);
  INSERT INTO learner_tallies (quarter, learner, profile, feedback, site_id, instructor_id, manikin_id, attempts, passed, first_started, first_id, first_passed)
  SELECT a.quarter, a.learner, a.profile, a.feedback, a.site_id, a.instructor_id, coalesce(a.manikin_id, 0),
    (SELECT count(*) FROM attempts b WHERE b.learner = old.learner AND b.quarter = old.quarter AND b.profile = old.profile AND b.feedback = old.feedback AND b.site_id = old.site_id AND b.instructor_id = old.instructor_id AND b.manikin_id IS old.manikin_id),
    (SELECT sum(b.passed) FROM attempts b WHERE b.learner = old.learner AND b.quarter = old.quarter AND b.profile = old.profile AND b.feedback = old.feedback AND b.site_id = old.site_id AND b.instructor_id = old.instructor_id AND b.manikin_id IS old.manikin_id),
    a.started_at, a.id, a.passed
  FROM attempts a WHERE a.learner = old.learner AND a.quarter = old.quarter AND a.profile = old.profile AND a.feedback = old.feedback AND a.site_id = old.site_id AND a.instructor_id = old.instructor_id AND a.manikin_id IS old.manikin_id
  ORDER BY a.started_at, a.id LIMIT 1;
  DELETE FROM learner_quarters WHERE quarter = old.quarter AND learner = old.learner;
  INSERT INTO learner_quarters (quarter, learner, attempts, passed, first_started, first_id, first_passed)
  SELECT a.quarter, a.learner, (SELECT count(*) FROM attempts b WHERE b.learner = old.learner AND b.quarter = old.quarter), (SELECT sum(b.passed) FROM attempts b WHERE b.learner = old.learner AND b.quarter = old.quarter),
    a.started_at, a.id, a.passed
  FROM attempts a WHERE a.learner = old.learner AND a.quarter = old.quarter
  ORDER BY a.started_at, a.id LIMIT 1;
  INSERT OR IGNORE INTO instructor_values_stale (quarter, instructor_id) VALUES (old.quarter, old.instructor_id);
END;
--> statement-breakpoint
CREATE TRIGGER attempts_values_update AFTER UPDATE OF quarter, profile, feedback, site_id, instructor_id, manikin_id, passed, instructor_result, error_mask, compressions, score, depth_ok_pct, rate_ok_pct, recoil_ok_pct, hands_on_pct ON attempts
  WHEN (old.quarter IS NOT new.quarter OR old.profile IS NOT new.profile OR old.feedback IS NOT new.feedback OR old.site_id IS NOT new.site_id OR old.instructor_id IS NOT new.instructor_id OR old.manikin_id IS NOT new.manikin_id OR old.passed IS NOT new.passed OR old.instructor_result IS NOT new.instructor_result OR old.error_mask IS NOT new.error_mask OR old.compressions IS NOT new.compressions OR old.score IS NOT new.score OR old.depth_ok_pct IS NOT new.depth_ok_pct OR old.rate_ok_pct IS NOT new.rate_ok_pct OR old.recoil_ok_pct IS NOT new.recoil_ok_pct OR old.hands_on_pct IS NOT new.hands_on_pct) AND old.id NOT IN (SELECT id FROM summary_pending)
BEGIN
  INSERT INTO network_values (metric, quarter, profile, feedback, value, count)
  VALUES
    ('score', old.quarter, old.profile, old.feedback, old.score, -1),
    ('depth_ok_pct', old.quarter, old.profile, old.feedback, old.depth_ok_pct, -1),
    ('rate_ok_pct', old.quarter, old.profile, old.feedback, old.rate_ok_pct, -1),
    ('recoil_ok_pct', old.quarter, old.profile, old.feedback, old.recoil_ok_pct, -1),
    ('hands_on_pct', old.quarter, old.profile, old.feedback, old.hands_on_pct, -1)
  ON CONFLICT (metric, quarter, profile, feedback, value) DO UPDATE SET count = count + excluded.count;
  DELETE FROM network_values WHERE metric = 'score' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.score AND count = 0;
  DELETE FROM network_values WHERE metric = 'depth_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.depth_ok_pct AND count = 0;
  DELETE FROM network_values WHERE metric = 'rate_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.rate_ok_pct AND count = 0;
  DELETE FROM network_values WHERE metric = 'recoil_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.recoil_ok_pct AND count = 0;
  DELETE FROM network_values WHERE metric = 'hands_on_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND value = old.hands_on_pct AND count = 0;
  INSERT INTO network_values (metric, quarter, profile, feedback, value, count)
  VALUES
    ('score', new.quarter, new.profile, new.feedback, new.score, 1),
    ('depth_ok_pct', new.quarter, new.profile, new.feedback, new.depth_ok_pct, 1),
    ('rate_ok_pct', new.quarter, new.profile, new.feedback, new.rate_ok_pct, 1),
    ('recoil_ok_pct', new.quarter, new.profile, new.feedback, new.recoil_ok_pct, 1),
    ('hands_on_pct', new.quarter, new.profile, new.feedback, new.hands_on_pct, 1)
  ON CONFLICT (metric, quarter, profile, feedback, value) DO UPDATE SET count = count + excluded.count;
  INSERT OR IGNORE INTO instructor_values_stale (quarter, instructor_id) VALUES (old.quarter, old.instructor_id);
  INSERT OR IGNORE INTO instructor_values_stale (quarter, instructor_id) VALUES (new.quarter, new.instructor_id);
END;
--> statement-breakpoint
-- every stored instructor-quarter is built on the next open (refreshInstructorValues)
INSERT INTO instructor_values_stale (quarter, instructor_id) SELECT DISTINCT quarter, instructor_id FROM attempts;
--> statement-breakpoint
DROP TABLE `attempt_values`;
