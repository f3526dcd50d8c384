-- Outside localizers a process offers (names from its administrator's allow-list, separated by
-- commas; empty for none). A run that names one is taken only by processes that offer it.
ALTER TABLE work_process ADD COLUMN localizers VARCHAR(2000) DEFAULT '' NOT NULL;
