-- Outside localizers a process offers (names from its administrator's allow-list, separated by
-- commas; empty for none). A run that names one is taken only by processes that offer it.
ALTER TABLE work_process ADD COLUMN localizers VARCHAR(2000) DEFAULT '' NOT NULL;

-- The outside localizer a suite run judged in every cell (NULL: the built-in one). A suite run's
-- automatic baseline is the previous finished run that judged the same localizer.
ALTER TABLE suite_run ADD COLUMN localizer VARCHAR(40);
