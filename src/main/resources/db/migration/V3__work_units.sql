-- Runs are cut into work units that any server or worker process may execute (see DEVELOPERS.md,
-- "Work units"). Portable SQL for H2 and PostgreSQL, as V1.

-- The work engine's own table (db-scheduler 16.x). Its published PostgreSQL schema uses TEXT keys;
-- VARCHAR keeps the same meaning and is also a valid primary key on H2.
CREATE TABLE scheduled_tasks (
    task_name VARCHAR(100) NOT NULL,
    task_instance VARCHAR(200) NOT NULL,
    task_data BYTEA,
    execution_time TIMESTAMP WITH TIME ZONE NOT NULL,
    picked BOOLEAN NOT NULL,
    picked_by VARCHAR(200),
    last_success TIMESTAMP WITH TIME ZONE,
    last_failure TIMESTAMP WITH TIME ZONE,
    consecutive_failures INTEGER,
    last_heartbeat TIMESTAMP WITH TIME ZONE,
    version BIGINT NOT NULL,
    priority SMALLINT,
    PRIMARY KEY (task_name, task_instance)
);
CREATE INDEX execution_time_idx ON scheduled_tasks (execution_time);
CREATE INDEX last_heartbeat_idx ON scheduled_tasks (last_heartbeat);
CREATE INDEX priority_execution_time_idx ON scheduled_tasks (priority DESC, execution_time ASC);

-- One row per unit: which of the run's seeds (by position in its seed list) it runs, and who ran it.
CREATE TABLE run_unit (
    run_id BIGINT NOT NULL REFERENCES run (id) ON DELETE CASCADE,
    unit_no INTEGER NOT NULL,
    first_index INTEGER NOT NULL,
    seed_count INTEGER NOT NULL,
    state VARCHAR(20) NOT NULL,
    worker VARCHAR(200),
    attempts INTEGER NOT NULL,
    progress DOUBLE PRECISION NOT NULL,
    started_at TIMESTAMP WITH TIME ZONE,
    finished_at TIMESTAMP WITH TIME ZONE,
    PRIMARY KEY (run_id, unit_no)
);
CREATE INDEX run_unit_by_worker ON run_unit (worker, state);

-- One row per finished trial, written once: a unit that runs again finds its seeds here.
CREATE TABLE run_trial (
    run_id BIGINT NOT NULL REFERENCES run (id) ON DELETE CASCADE,
    seed BIGINT NOT NULL,
    outcome TEXT NOT NULL,
    trace TEXT,
    seconds DOUBLE PRECISION NOT NULL,
    worker VARCHAR(200) NOT NULL,
    finished_at TIMESTAMP WITH TIME ZONE NOT NULL,
    PRIMARY KEY (run_id, seed)
);
CREATE INDEX run_trial_by_time ON run_trial (finished_at);

-- Every process that executes units says it is alive here every few seconds.
CREATE TABLE work_process (
    name VARCHAR(200) PRIMARY KEY,
    host VARCHAR(200) NOT NULL,
    role VARCHAR(20) NOT NULL,
    threads INTEGER NOT NULL,
    started_at TIMESTAMP WITH TIME ZONE NOT NULL,
    last_seen TIMESTAMP WITH TIME ZONE NOT NULL,
    stopped_at TIMESTAMP WITH TIME ZONE,
    units_done BIGINT NOT NULL,
    trials_done BIGINT NOT NULL
);
