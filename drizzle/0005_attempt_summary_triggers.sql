-- Keeps the attempt summaries (attempt_tallies, network_tallies, attempt_values, network_values,
-- learner_tallies, learner_quarters) equal to sums over attempts, in the transaction of every write to attempts
-- (import, undo, rescore, policy change, edits). A deleted or changed attempt is taken out of its groups and the
-- changed one put in; groups that fall to zero are removed; a learner's rows are recomputed from their attempts
-- when one of them goes or changes.
CREATE TRIGGER attempts_tally_insert AFTER INSERT ON attempts WHEN NOT EXISTS (SELECT 1 FROM summary_deferral) BEGIN
  INSERT INTO attempt_tallies (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.policy_version, 1, new.passed, (new.instructor_result IS 'pass' AND new.passed = 1), (new.instructor_result IS 'pass' AND new.passed = 0), (new.instructor_result IS 'fail' AND new.passed = 1), (new.instructor_result IS 'fail' AND new.passed = 0), (new.error_mask != 0), new.compressions, ((new.error_mask >> 0) & 1), ((new.error_mask >> 1) & 1), ((new.error_mask >> 2) & 1), ((new.error_mask >> 3) & 1), ((new.error_mask >> 4) & 1), ((new.error_mask >> 5) & 1), ((new.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
  INSERT INTO network_tallies (quarter, profile, feedback, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (new.quarter, new.profile, new.feedback, new.policy_version, 1, new.passed, (new.instructor_result IS 'pass' AND new.passed = 1), (new.instructor_result IS 'pass' AND new.passed = 0), (new.instructor_result IS 'fail' AND new.passed = 1), (new.instructor_result IS 'fail' AND new.passed = 0), (new.error_mask != 0), new.compressions, ((new.error_mask >> 0) & 1), ((new.error_mask >> 1) & 1), ((new.error_mask >> 2) & 1), ((new.error_mask >> 3) & 1), ((new.error_mask >> 4) & 1), ((new.error_mask >> 5) & 1), ((new.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
  INSERT INTO attempt_values (metric, quarter, profile, feedback, site_id, instructor_id, manikin_id, value, count)
  VALUES
    ('score', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.score, 1),
    ('depth_ok_pct', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.depth_ok_pct, 1),
    ('rate_ok_pct', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.rate_ok_pct, 1),
    ('recoil_ok_pct', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.recoil_ok_pct, 1),
    ('hands_on_pct', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.hands_on_pct, 1)
  ON CONFLICT (metric, quarter, instructor_id, value, profile, feedback, site_id, manikin_id) DO UPDATE SET count = count + excluded.count;
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
END;
--> statement-breakpoint
-- inside a bulk import: only note the attempt; the import adds its attempts to the summaries set-wise
CREATE TRIGGER attempts_summary_pending AFTER INSERT ON attempts WHEN EXISTS (SELECT 1 FROM summary_deferral) BEGIN
  INSERT INTO summary_pending (id) VALUES (new.id);
END;
--> statement-breakpoint
-- an attempt still pending is not in the summaries yet: changing or deleting it touches nothing there
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
  INSERT INTO attempt_values (metric, quarter, profile, feedback, site_id, instructor_id, manikin_id, value, count)
  VALUES
    ('score', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.score, -1),
    ('depth_ok_pct', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.depth_ok_pct, -1),
    ('rate_ok_pct', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.rate_ok_pct, -1),
    ('recoil_ok_pct', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.recoil_ok_pct, -1),
    ('hands_on_pct', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.hands_on_pct, -1)
  ON CONFLICT (metric, quarter, instructor_id, value, profile, feedback, site_id, manikin_id) DO UPDATE SET count = count + excluded.count;
  DELETE FROM attempt_values WHERE metric = 'score' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.score AND count = 0;
  DELETE FROM attempt_values WHERE metric = 'depth_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.depth_ok_pct AND count = 0;
  DELETE FROM attempt_values WHERE metric = 'rate_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.rate_ok_pct AND count = 0;
  DELETE FROM attempt_values WHERE metric = 'recoil_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.recoil_ok_pct AND count = 0;
  DELETE FROM attempt_values WHERE metric = 'hands_on_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.hands_on_pct AND count = 0;
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
END;
--> statement-breakpoint
CREATE TRIGGER attempts_tally_update AFTER UPDATE OF quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version, passed, instructor_result, error_mask, compressions ON attempts
  WHEN (old.quarter IS NOT new.quarter OR old.profile IS NOT new.profile OR old.feedback IS NOT new.feedback OR old.site_id IS NOT new.site_id OR old.instructor_id IS NOT new.instructor_id OR old.manikin_id IS NOT new.manikin_id OR old.policy_version IS NOT new.policy_version OR old.passed IS NOT new.passed OR old.instructor_result IS NOT new.instructor_result OR old.error_mask IS NOT new.error_mask OR old.compressions IS NOT new.compressions) AND old.id NOT IN (SELECT id FROM summary_pending)
BEGIN
  INSERT INTO attempt_tallies (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.policy_version, -1, -old.passed, -(old.instructor_result IS 'pass' AND old.passed = 1), -(old.instructor_result IS 'pass' AND old.passed = 0), -(old.instructor_result IS 'fail' AND old.passed = 1), -(old.instructor_result IS 'fail' AND old.passed = 0), -(old.error_mask != 0), -old.compressions, -((old.error_mask >> 0) & 1), -((old.error_mask >> 1) & 1), -((old.error_mask >> 2) & 1), -((old.error_mask >> 3) & 1), -((old.error_mask >> 4) & 1), -((old.error_mask >> 5) & 1), -((old.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
  DELETE FROM attempt_tallies WHERE quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND policy_version = old.policy_version AND n = 0;
  INSERT INTO attempt_tallies (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.policy_version, 1, new.passed, (new.instructor_result IS 'pass' AND new.passed = 1), (new.instructor_result IS 'pass' AND new.passed = 0), (new.instructor_result IS 'fail' AND new.passed = 1), (new.instructor_result IS 'fail' AND new.passed = 0), (new.error_mask != 0), new.compressions, ((new.error_mask >> 0) & 1), ((new.error_mask >> 1) & 1), ((new.error_mask >> 2) & 1), ((new.error_mask >> 3) & 1), ((new.error_mask >> 4) & 1), ((new.error_mask >> 5) & 1), ((new.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
  INSERT INTO network_tallies (quarter, profile, feedback, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (old.quarter, old.profile, old.feedback, old.policy_version, -1, -old.passed, -(old.instructor_result IS 'pass' AND old.passed = 1), -(old.instructor_result IS 'pass' AND old.passed = 0), -(old.instructor_result IS 'fail' AND old.passed = 1), -(old.instructor_result IS 'fail' AND old.passed = 0), -(old.error_mask != 0), -old.compressions, -((old.error_mask >> 0) & 1), -((old.error_mask >> 1) & 1), -((old.error_mask >> 2) & 1), -((old.error_mask >> 3) & 1), -((old.error_mask >> 4) & 1), -((old.error_mask >> 5) & 1), -((old.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
  DELETE FROM network_tallies WHERE quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND policy_version = old.policy_version AND n = 0;
  INSERT INTO network_tallies (quarter, profile, feedback, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
  VALUES (new.quarter, new.profile, new.feedback, new.policy_version, 1, new.passed, (new.instructor_result IS 'pass' AND new.passed = 1), (new.instructor_result IS 'pass' AND new.passed = 0), (new.instructor_result IS 'fail' AND new.passed = 1), (new.instructor_result IS 'fail' AND new.passed = 0), (new.error_mask != 0), new.compressions, ((new.error_mask >> 0) & 1), ((new.error_mask >> 1) & 1), ((new.error_mask >> 2) & 1), ((new.error_mask >> 3) & 1), ((new.error_mask >> 4) & 1), ((new.error_mask >> 5) & 1), ((new.error_mask >> 6) & 1))
  ON CONFLICT (quarter, profile, feedback, policy_version) DO UPDATE SET n = n + excluded.n, passed = passed + excluded.passed, judged_pp = judged_pp + excluded.judged_pp, judged_pf = judged_pf + excluded.judged_pf, judged_fp = judged_fp + excluded.judged_fp, judged_ff = judged_ff + excluded.judged_ff, with_errors = with_errors + excluded.with_errors, compressions = compressions + excluded.compressions, err_too_shallow = err_too_shallow + excluded.err_too_shallow, err_too_deep = err_too_deep + excluded.err_too_deep, err_too_slow = err_too_slow + excluded.err_too_slow, err_too_fast = err_too_fast + excluded.err_too_fast, err_incomplete_recoil = err_incomplete_recoil + excluded.err_incomplete_recoil, err_low_hands_on = err_low_hands_on + excluded.err_low_hands_on, err_long_pause = err_long_pause + excluded.err_long_pause;
END;
--> statement-breakpoint
CREATE TRIGGER attempts_values_update AFTER UPDATE OF quarter, profile, feedback, site_id, instructor_id, manikin_id, score, depth_ok_pct, rate_ok_pct, recoil_ok_pct, hands_on_pct ON attempts
  WHEN (old.quarter IS NOT new.quarter OR old.profile IS NOT new.profile OR old.feedback IS NOT new.feedback OR old.site_id IS NOT new.site_id OR old.instructor_id IS NOT new.instructor_id OR old.manikin_id IS NOT new.manikin_id OR old.score IS NOT new.score OR old.depth_ok_pct IS NOT new.depth_ok_pct OR old.rate_ok_pct IS NOT new.rate_ok_pct OR old.recoil_ok_pct IS NOT new.recoil_ok_pct OR old.hands_on_pct IS NOT new.hands_on_pct) AND old.id NOT IN (SELECT id FROM summary_pending)
BEGIN
  INSERT INTO attempt_values (metric, quarter, profile, feedback, site_id, instructor_id, manikin_id, value, count)
  VALUES
    ('score', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.score, -1),
    ('depth_ok_pct', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.depth_ok_pct, -1),
    ('rate_ok_pct', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.rate_ok_pct, -1),
    ('recoil_ok_pct', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.recoil_ok_pct, -1),
    ('hands_on_pct', old.quarter, old.profile, old.feedback, old.site_id, old.instructor_id, coalesce(old.manikin_id, 0), old.hands_on_pct, -1)
  ON CONFLICT (metric, quarter, instructor_id, value, profile, feedback, site_id, manikin_id) DO UPDATE SET count = count + excluded.count;
  DELETE FROM attempt_values WHERE metric = 'score' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.score AND count = 0;
  DELETE FROM attempt_values WHERE metric = 'depth_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.depth_ok_pct AND count = 0;
  DELETE FROM attempt_values WHERE metric = 'rate_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.rate_ok_pct AND count = 0;
  DELETE FROM attempt_values WHERE metric = 'recoil_ok_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.recoil_ok_pct AND count = 0;
  DELETE FROM attempt_values WHERE metric = 'hands_on_pct' AND quarter = old.quarter AND profile = old.profile AND feedback = old.feedback AND site_id = old.site_id
    AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0) AND value = old.hands_on_pct AND count = 0;
  INSERT INTO attempt_values (metric, quarter, profile, feedback, site_id, instructor_id, manikin_id, value, count)
  VALUES
    ('score', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.score, 1),
    ('depth_ok_pct', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.depth_ok_pct, 1),
    ('rate_ok_pct', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.rate_ok_pct, 1),
    ('recoil_ok_pct', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.recoil_ok_pct, 1),
    ('hands_on_pct', new.quarter, new.profile, new.feedback, new.site_id, new.instructor_id, coalesce(new.manikin_id, 0), new.hands_on_pct, 1)
  ON CONFLICT (metric, quarter, instructor_id, value, profile, feedback, site_id, manikin_id) DO UPDATE SET count = count + excluded.count;
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
END;
--> statement-breakpoint
CREATE TRIGGER attempts_learner_update AFTER UPDATE OF learner, quarter, profile, feedback, site_id, instructor_id, manikin_id, passed, started_at, id ON attempts
  WHEN (old.learner IS NOT new.learner OR old.quarter IS NOT new.quarter OR old.profile IS NOT new.profile OR old.feedback IS NOT new.feedback OR old.site_id IS NOT new.site_id OR old.instructor_id IS NOT new.instructor_id OR old.manikin_id IS NOT new.manikin_id OR old.passed IS NOT new.passed OR old.started_at IS NOT new.started_at OR old.id IS NOT new.id) AND old.id NOT IN (SELECT id FROM summary_pending)
BEGIN
  DELETE FROM learner_tallies WHERE quarter = old.quarter AND learner = old.learner AND profile = old.profile AND feedback = old.feedback
    AND site_id = old.site_id AND instructor_id = old.instructor_id AND manikin_id = coalesce(old.manikin_id, 0);
  INSERT INTO learner_tallies (quarter, learner, profile, feedback, site_id, instructor_id, manikin_id, attempts, passed, first_started, first_id, first_passed)
  SELECT a.quarter, a.learner, a.profile, a.feedback, a.site_id, a.instructor_id, coalesce(a.manikin_id, 0),
    (SELECT count(*) FROM attempts b WHERE b.learner = old.learner AND b.quarter = old.quarter AND b.profile = old.profile AND b.feedback = old.feedback AND b.site_id = old.site_id AND b.instructor_id = old.instructor_id AND b.manikin_id IS old.manikin_id),
    (SELECT sum(b.passed) FROM attempts b WHERE b.learner = old.learner AND b.quarter = old.quarter AND b.profile = old.profile AND b.feedback = old.feedback AND b.site_id = old.site_id AND b.instructor_id = old.instructor_id AND b.manikin_id IS old.manikin_id),
    a.started_at, a.id, a.passed
  FROM attempts a WHERE a.learner = old.learner AND a.quarter = old.quarter AND a.profile = old.profile AND a.feedback = old.feedback AND a.site_id = old.site_id AND a.instructor_id = old.instructor_id AND a.manikin_id IS old.manikin_id
  ORDER BY a.started_at, a.id LIMIT 1;
  DELETE FROM learner_tallies WHERE quarter = new.quarter AND learner = new.learner AND profile = new.profile AND feedback = new.feedback
    AND site_id = new.site_id AND instructor_id = new.instructor_id AND manikin_id = coalesce(new.manikin_id, 0);
  INSERT INTO learner_tallies (quarter, learner, profile, feedback, site_id, instructor_id, manikin_id, attempts, passed, first_started, first_id, first_passed)
  SELECT a.quarter, a.learner, a.profile, a.feedback, a.site_id, a.instructor_id, coalesce(a.manikin_id, 0),
    (SELECT count(*) FROM attempts b WHERE b.learner = new.learner AND b.quarter = new.quarter AND b.profile = new.profile AND b.feedback = new.feedback AND b.site_id = new.site_id AND b.instructor_id = new.instructor_id AND b.manikin_id IS new.manikin_id),
    (SELECT sum(b.passed) FROM attempts b WHERE b.learner = new.learner AND b.quarter = new.quarter AND b.profile = new.profile AND b.feedback = new.feedback AND b.site_id = new.site_id AND b.instructor_id = new.instructor_id AND b.manikin_id IS new.manikin_id),
    a.started_at, a.id, a.passed
  FROM attempts a WHERE a.learner = new.learner AND a.quarter = new.quarter AND a.profile = new.profile AND a.feedback = new.feedback AND a.site_id = new.site_id AND a.instructor_id = new.instructor_id AND a.manikin_id IS new.manikin_id
  ORDER BY a.started_at, a.id LIMIT 1;
  DELETE FROM learner_quarters WHERE quarter = old.quarter AND learner = old.learner;
  INSERT INTO learner_quarters (quarter, learner, attempts, passed, first_started, first_id, first_passed)
  SELECT a.quarter, a.learner, (SELECT count(*) FROM attempts b WHERE b.learner = old.learner AND b.quarter = old.quarter), (SELECT sum(b.passed) FROM attempts b WHERE b.learner = old.learner AND b.quarter = old.quarter),
    a.started_at, a.id, a.passed
  FROM attempts a WHERE a.learner = old.learner AND a.quarter = old.quarter
  ORDER BY a.started_at, a.id LIMIT 1;
  DELETE FROM learner_quarters WHERE quarter = new.quarter AND learner = new.learner;
  INSERT INTO learner_quarters (quarter, learner, attempts, passed, first_started, first_id, first_passed)
  SELECT a.quarter, a.learner, (SELECT count(*) FROM attempts b WHERE b.learner = new.learner AND b.quarter = new.quarter), (SELECT sum(b.passed) FROM attempts b WHERE b.learner = new.learner AND b.quarter = new.quarter),
    a.started_at, a.id, a.passed
  FROM attempts a WHERE a.learner = new.learner AND a.quarter = new.quarter
  ORDER BY a.started_at, a.id LIMIT 1;
END;
--> statement-breakpoint
-- a learner's previous quarters (with attempts, with a pass), so that a range counts each learner once
CREATE TRIGGER learner_quarters_insert AFTER INSERT ON learner_quarters BEGIN
  UPDATE learner_quarters SET
    prev_quarter = (SELECT max(p.quarter) FROM learner_quarters p WHERE p.learner = learner_quarters.learner AND p.quarter < learner_quarters.quarter),
    prev_pass_quarter = (SELECT max(p.quarter) FROM learner_quarters p WHERE p.learner = learner_quarters.learner AND p.quarter < learner_quarters.quarter AND p.passed > 0)
  WHERE learner = new.learner AND quarter >= new.quarter;
END;
--> statement-breakpoint
CREATE TRIGGER learner_quarters_delete AFTER DELETE ON learner_quarters BEGIN
  UPDATE learner_quarters SET
    prev_quarter = (SELECT max(p.quarter) FROM learner_quarters p WHERE p.learner = learner_quarters.learner AND p.quarter < learner_quarters.quarter),
    prev_pass_quarter = (SELECT max(p.quarter) FROM learner_quarters p WHERE p.learner = learner_quarters.learner AND p.quarter < learner_quarters.quarter AND p.passed > 0)
  WHERE learner = old.learner AND quarter > old.quarter;
END;
--> statement-breakpoint
CREATE TRIGGER learner_quarters_pass AFTER UPDATE OF passed ON learner_quarters
  WHEN (old.passed > 0) <> (new.passed > 0)
BEGIN
  UPDATE learner_quarters SET
    prev_quarter = (SELECT max(p.quarter) FROM learner_quarters p WHERE p.learner = learner_quarters.learner AND p.quarter < learner_quarters.quarter),
    prev_pass_quarter = (SELECT max(p.quarter) FROM learner_quarters p WHERE p.learner = learner_quarters.learner AND p.quarter < learner_quarters.quarter AND p.passed > 0)
  WHERE learner = new.learner AND quarter > new.quarter;
END;
--> statement-breakpoint
-- attempts already stored
INSERT INTO learner_quarters (quarter, learner, attempts, passed, first_started, first_id, first_passed)
SELECT quarter, learner, count(*), sum(passed), first_started, first_id, first_passed
FROM (
  SELECT *, first_value(started_at) OVER w AS first_started, first_value(id) OVER w AS first_id, first_value(passed) OVER w AS first_passed FROM attempts
  WINDOW w AS (PARTITION BY quarter, learner ORDER BY started_at, id)
) GROUP BY quarter, learner;
--> statement-breakpoint
INSERT INTO learner_tallies (quarter, learner, profile, feedback, site_id, instructor_id, manikin_id, attempts, passed, first_started, first_id, first_passed)
SELECT quarter, learner, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), count(*), sum(passed), first_started, first_id, first_passed
FROM (
  SELECT *, first_value(started_at) OVER w AS first_started, first_value(id) OVER w AS first_id, first_value(passed) OVER w AS first_passed FROM attempts
  WINDOW w AS (PARTITION BY quarter, learner, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0) ORDER BY started_at, id)
) GROUP BY quarter, learner, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0);
--> statement-breakpoint
INSERT INTO attempt_tallies (quarter, profile, feedback, site_id, instructor_id, manikin_id, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
SELECT quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), policy_version, count(*), sum(passed),
  sum(instructor_result IS 'pass' AND passed = 1), sum(instructor_result IS 'pass' AND passed = 0),
  sum(instructor_result IS 'fail' AND passed = 1), sum(instructor_result IS 'fail' AND passed = 0),
  sum(error_mask != 0), sum(compressions),
  sum((error_mask >> 0) & 1), sum((error_mask >> 1) & 1), sum((error_mask >> 2) & 1), sum((error_mask >> 3) & 1), sum((error_mask >> 4) & 1), sum((error_mask >> 5) & 1), sum((error_mask >> 6) & 1)
FROM attempts GROUP BY quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), policy_version;
--> statement-breakpoint
INSERT INTO network_tallies (quarter, profile, feedback, policy_version, n, passed, judged_pp, judged_pf, judged_fp, judged_ff, with_errors, compressions, err_too_shallow, err_too_deep, err_too_slow, err_too_fast, err_incomplete_recoil, err_low_hands_on, err_long_pause)
SELECT quarter, profile, feedback, policy_version, sum(n), sum(passed), sum(judged_pp), sum(judged_pf), sum(judged_fp), sum(judged_ff), sum(with_errors), sum(compressions), sum(err_too_shallow), sum(err_too_deep), sum(err_too_slow), sum(err_too_fast), sum(err_incomplete_recoil), sum(err_low_hands_on), sum(err_long_pause)
FROM attempt_tallies GROUP BY quarter, profile, feedback, policy_version;
--> statement-breakpoint
UPDATE learner_quarters SET
  prev_quarter = (SELECT max(p.quarter) FROM learner_quarters p WHERE p.learner = learner_quarters.learner AND p.quarter < learner_quarters.quarter),
  prev_pass_quarter = (SELECT max(p.quarter) FROM learner_quarters p WHERE p.learner = learner_quarters.learner AND p.quarter < learner_quarters.quarter AND p.passed > 0);
--> statement-breakpoint
INSERT INTO attempt_values (metric, quarter, profile, feedback, site_id, instructor_id, manikin_id, value, count)
SELECT 'score', quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), score, count(*)
FROM attempts GROUP BY quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), score;
--> statement-breakpoint
INSERT INTO network_values (metric, quarter, profile, feedback, value, count)
SELECT 'score', quarter, profile, feedback, score, count(*)
FROM attempts GROUP BY quarter, profile, feedback, score;
--> statement-breakpoint
INSERT INTO attempt_values (metric, quarter, profile, feedback, site_id, instructor_id, manikin_id, value, count)
SELECT 'depth_ok_pct', quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), depth_ok_pct, count(*)
FROM attempts GROUP BY quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), depth_ok_pct;
--> statement-breakpoint
INSERT INTO network_values (metric, quarter, profile, feedback, value, count)
SELECT 'depth_ok_pct', quarter, profile, feedback, depth_ok_pct, count(*)
FROM attempts GROUP BY quarter, profile, feedback, depth_ok_pct;
--> statement-breakpoint
INSERT INTO attempt_values (metric, quarter, profile, feedback, site_id, instructor_id, manikin_id, value, count)
SELECT 'rate_ok_pct', quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), rate_ok_pct, count(*)
FROM attempts GROUP BY quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), rate_ok_pct;
--> statement-breakpoint
INSERT INTO network_values (metric, quarter, profile, feedback, value, count)
SELECT 'rate_ok_pct', quarter, profile, feedback, rate_ok_pct, count(*)
FROM attempts GROUP BY quarter, profile, feedback, rate_ok_pct;
--> statement-breakpoint
INSERT INTO attempt_values (metric, quarter, profile, feedback, site_id, instructor_id, manikin_id, value, count)
SELECT 'recoil_ok_pct', quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), recoil_ok_pct, count(*)
FROM attempts GROUP BY quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), recoil_ok_pct;
--> statement-breakpoint
INSERT INTO network_values (metric, quarter, profile, feedback, value, count)
SELECT 'recoil_ok_pct', quarter, profile, feedback, recoil_ok_pct, count(*)
FROM attempts GROUP BY quarter, profile, feedback, recoil_ok_pct;
--> statement-breakpoint
INSERT INTO attempt_values (metric, quarter, profile, feedback, site_id, instructor_id, manikin_id, value, count)
SELECT 'hands_on_pct', quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), hands_on_pct, count(*)
FROM attempts GROUP BY quarter, profile, feedback, site_id, instructor_id, coalesce(manikin_id, 0), hands_on_pct;
--> statement-breakpoint
INSERT INTO network_values (metric, quarter, profile, feedback, value, count)
SELECT 'hands_on_pct', quarter, profile, feedback, hands_on_pct, count(*)
FROM attempts GROUP BY quarter, profile, feedback, hands_on_pct;
