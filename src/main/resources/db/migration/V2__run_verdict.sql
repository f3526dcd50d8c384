-- The verdict of a finished run (pass, fail, ended-early, not-exercised, incomplete: the file
-- names of evaluation.Verdict), kept beside the result so run lists need not read the result.
-- Runs stored before this column stay NULL until the start-up backfill reads their results.
ALTER TABLE run ADD COLUMN verdict VARCHAR(20);
