package dev.driftlab.app.runs;

import com.github.kagkarlsson.scheduler.Scheduler;
import com.github.kagkarlsson.scheduler.SchedulerClient;
import com.github.kagkarlsson.scheduler.SchedulerName;
import com.github.kagkarlsson.scheduler.task.Task;
import com.github.kagkarlsson.scheduler.task.TaskInstance;
import com.github.kagkarlsson.scheduler.task.helper.OneTimeTask;
import com.github.kagkarlsson.scheduler.task.helper.Tasks;
import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.app.runs.persistence.UnitRepository;
import dev.driftlab.app.scenarios.ScenarioStore;
import java.net.InetAddress;
import java.sql.Connection;
import java.sql.SQLException;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.ThreadLocalRandom;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import javax.sql.DataSource;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.ObjectProvider;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.context.SmartLifecycle;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.jdbc.datasource.TransactionAwareDataSourceProxy;
import org.springframework.stereotype.Component;
import org.springframework.transaction.support.TransactionTemplate;

/**
 * The durable work engine: db-scheduler over the app's own database. Every unit of every run is a
 * one-time task in the {@code scheduled_tasks} table; every server and worker process that runs
 * units polls that table, takes due units (on PostgreSQL with {@code SELECT ... FOR UPDATE SKIP
 * LOCKED}), and sends a heartbeat for each unit it holds. A unit whose process stops sending
 * heartbeats (killed, power cut) is taken again by another process once the heartbeat is {@link
 * #MISSED_HEARTBEATS} beats late. Units are scheduled in the same transaction that stores their
 * run, so a run is queued whole or not at all.
 *
 * <p>This process also says it is alive in {@code work_process} and watches the runs it holds
 * units of, so a cancel made on any process stops them here within about a second.
 */
@Component
public class WorkEngine implements SmartLifecycle {

    /** How often a process looks for due units. */
    static final Duration POLL = Duration.ofSeconds(1);
    /** How often a process says, for each unit it holds, that it is still on it. */
    static final Duration HEARTBEAT = Duration.ofSeconds(2);
    /** Beats missed before a unit's holder counts as dead and the unit is taken again. */
    static final int MISSED_HEARTBEATS = 4;
    /** How often this process checks whether the runs it holds units of were cancelled. */
    static final Duration WATCH = Duration.ofMillis(500);

    private static final Logger LOG = LoggerFactory.getLogger(WorkEngine.class);

    private final DataSource dataSource;
    private final UnitRepository units;
    private final RunRepository runs;
    private final Clock clock;
    private final boolean execute;
    private final int threads;
    private final String role;
    private final String name;
    private final String host;
    private final OffsetDateTime startedAt;
    private final AtomicBoolean stopping = new AtomicBoolean();
    private final UnitWork work;
    /** One task per localizer this process offers: the built-in one's, then one per allow-list entry. */
    private final List<OneTimeTask<Void>> tasks;

    private final String offered;
    private final SchedulerClient client;
    private final DataSource shared;
    private final boolean postgres;
    /** Built at each start: a stopped db-scheduler cannot start again (test contexts pause and resume). */
    private Scheduler scheduler;

    private ScheduledExecutorService watch;
    private volatile boolean running;

    public WorkEngine(
            DataSource dataSource,
            RunRepository runs,
            UnitRepository units,
            ScenarioStore scenarios,
            ObjectProvider<TrialExecutor> executors,
            TransactionTemplate tx,
            Optional<Clock> clock,
            @Value("${driftlab.runs.execute:true}") boolean execute,
            @Value("${driftlab.runs.workers:0}") int workers,
            @Value("${driftlab.role:server}") String role,
            LocalizerAllowList localizers) {
        this.dataSource = dataSource;
        this.runs = runs;
        this.units = units;
        this.clock = clock.orElse(Clock.systemUTC());
        this.execute = execute;
        this.threads = workers > 0 ? workers : Runtime.getRuntime().availableProcessors();
        this.role = role;
        this.host = hostName();
        this.name = clip(host, 120) + "/" + ProcessHandle.current().pid() + "/"
                + Integer.toString(ThreadLocalRandom.current().nextInt(36 * 36 * 36), 36);
        this.startedAt = OffsetDateTime.now(this.clock);
        this.work = new UnitWork(
                runs,
                units,
                scenarios,
                executors.getIfAvailable(UnwiredTrialExecutor::new),
                tx,
                this.clock,
                name,
                stopping);
        // a unit runs under the task of its run's localizer, and a process knows only the tasks of
        // the localizers it offers, so it never takes a unit it cannot run (see taskName)
        List<OneTimeTask<Void>> known = new ArrayList<>();
        known.add(unitTask(WorkUnits.taskName(null)));
        for (String localizer : localizers.names()) {
            known.add(unitTask(WorkUnits.taskName(localizer)));
        }
        this.tasks = List.copyOf(known);
        this.offered = String.join(",", localizers.names());
        // joins the caller's transaction, so units are stored with their run or not at all
        this.shared = new TransactionAwareDataSourceProxy(dataSource);
        this.postgres = postgres(dataSource);
        this.client = SchedulerClient.Builder.create(shared, new ArrayList<Task<?>>(tasks))
                .enablePriority()
                .build();
    }

    private OneTimeTask<Void> unitTask(String taskName) {
        return Tasks.oneTime(taskName)
                // a unit stopped with its process, or one whose database write failed, goes back in the queue
                .onFailure((complete, ops) ->
                        ops.reschedule(complete, Instant.now().plusSeconds(1)))
                .onDeadExecutionRevive()
                .execute((instance, context) -> {
                    long[] id = WorkUnits.parse(instance.getId());
                    work.execute(id[0], (int) id[1]);
                });
    }

    private Scheduler buildScheduler() {
        var builder = Scheduler.create(shared, new ArrayList<Task<?>>(tasks))
                .schedulerName(new SchedulerName.Fixed(name))
                .threads(threads)
                .pollingInterval(POLL)
                .heartbeatInterval(HEARTBEAT)
                .missedHeartbeatsLimit(MISSED_HEARTBEATS)
                .enablePriority()
                .commitWhenAutocommitDisabled(false)
                .shutdownMaxWait(Duration.ofSeconds(10))
                // units of a localizer this process does not offer are another process's work:
                // the engine's default would delete them after 14 days of nobody taking them
                .deleteUnresolvedAfter(Duration.ofDays(36_500));
        if (postgres) {
            // take due units with SELECT ... FOR UPDATE SKIP LOCKED: no two processes race for one
            builder.pollUsingLockAndFetch(0.5, 1.0);
        }
        return builder.build();
    }

    /** This process's name in the engine and on the workers page. */
    public String processName() {
        return name;
    }

    /** Whether this process runs units itself. */
    public boolean executes() {
        return execute;
    }

    /** Unit threads of this process (0 when it runs none). */
    public int threads() {
        return execute ? threads : 0;
    }

    /**
     * Queues a run's units; call inside the transaction that stores the run and its unit rows.
     *
     * @param localizer the run's outside localizer, or null for the built-in one: only processes
     *     that offer it take the units (this one need not)
     */
    void schedule(long runId, List<WorkUnits.Unit> cut, String localizer) {
        Instant now = Instant.now();
        String taskName = WorkUnits.taskName(localizer);
        for (WorkUnits.Unit u : cut) {
            TaskInstance<Void> instance = new TaskInstance<>(
                    taskName, WorkUnits.instanceId(runId, u.unitNo()), () -> null, WorkUnits.priority(u.unitNo()));
            client.schedule(instance, now);
        }
    }

    /** The outside localizers this process offers, names separated by commas. */
    public String offeredLocalizers() {
        return offered;
    }

    /**
     * Takes a run's waiting units out of the queue and stops its units on this process (other
     * processes see the run's new state within {@link #WATCH}).
     */
    void dropRun(long runId) {
        // units not yet taken; a taken one stops itself when it sees the run has ended
        JdbcClient.create(dataSource)
                .sql("DELETE FROM scheduled_tasks WHERE task_name LIKE ? AND task_instance LIKE ? AND picked = ?")
                .params(WorkUnits.ANY_TASK, "run-" + runId + "-%", false)
                .update();
        units.dropQueuedUnits(runId, OffsetDateTime.now(clock));
        work.stopRun(runId);
    }

    @Override
    public void start() {
        if (running) {
            return;
        }
        running = true;
        if (!execute) {
            return;
        }
        stopping.set(false);
        scheduler = buildScheduler();
        watch = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "driftlab-unit-watch");
            t.setDaemon(true);
            return t;
        });
        watch.scheduleWithFixedDelay(this::beat, 0, HEARTBEAT.toMillis(), TimeUnit.MILLISECONDS);
        watch.scheduleWithFixedDelay(this::watchCancels, WATCH.toMillis(), WATCH.toMillis(), TimeUnit.MILLISECONDS);
        scheduler.start();
        LOG.info(
                "work engine: process {} runs units on {} thread(s); outside localizers: {}",
                name,
                threads,
                offered.isEmpty() ? "none" : offered);
    }

    @Override
    public void stop() {
        if (!running) {
            return;
        }
        running = false;
        stopping.set(true);
        if (scheduler != null) {
            // units still running stop at their next check and go back in the queue
            scheduler.stop();
            scheduler = null;
            watch.shutdownNow();
            try {
                units.processStopped(name, OffsetDateTime.now(clock));
            } catch (RuntimeException e) {
                LOG.debug("could not record that this process stopped", e);
            }
        }
    }

    @Override
    public boolean isRunning() {
        return running;
    }

    @Override
    public int getPhase() {
        // after the database and before the web server stops taking requests
        return SmartLifecycle.DEFAULT_PHASE - 1000;
    }

    private void beat() {
        try {
            units.heartbeat(name, host, role, threads, offered, startedAt, OffsetDateTime.now(clock));
        } catch (RuntimeException e) {
            LOG.debug("heartbeat failed", e);
        }
    }

    private void watchCancels() {
        try {
            Set<Long> mine = work.activeRuns();
            for (long id : runs.ended(mine)) {
                work.stopRun(id);
            }
        } catch (RuntimeException e) {
            LOG.debug("cancel watch failed", e);
        }
    }

    private static boolean postgres(DataSource ds) {
        try (Connection c = ds.getConnection()) {
            return c.getMetaData()
                    .getDatabaseProductName()
                    .toLowerCase(Locale.ROOT)
                    .contains("postgres");
        } catch (SQLException e) {
            return false;
        }
    }

    private static String hostName() {
        try {
            return InetAddress.getLocalHost().getHostName();
        } catch (Exception e) {
            return "unknown-host";
        }
    }

    private static String clip(String s, int max) {
        return s.length() <= max ? s : s.substring(0, max);
    }
}
