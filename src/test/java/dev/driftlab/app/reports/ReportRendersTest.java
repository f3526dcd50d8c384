package dev.driftlab.app.reports;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.driftlab.app.runs.persistence.RunRepository.RunRow;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;

class ReportRendersTest {

    static RunRow run(long id, String state) {
        return new RunRow(
                id,
                1,
                1,
                1,
                "b" + id,
                "t",
                "base",
                "[1]",
                "{}",
                state,
                1,
                "",
                OffsetDateTime.now(),
                Optional.empty(),
                Optional.empty(),
                true,
                "",
                Optional.empty(),
                Optional.empty());
    }

    @Test
    void pdf_pastTheBound_refusedAtOnceWhileTheOthersRender() throws Exception {
        ReportRenders renders = new ReportRenders(1, 1, 1 << 20);
        CountDownLatch inside = new CountDownLatch(1);
        CountDownLatch release = new CountDownLatch(1);
        Thread first = new Thread(() -> renders.pdf("a", List.of(run(1, "done")), () -> {
            inside.countDown();
            try {
                release.await(10, TimeUnit.SECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            return new byte[10];
        }));
        first.start();
        assertThat(inside.await(10, TimeUnit.SECONDS)).isTrue();

        long t0 = System.nanoTime();
        assertThatThrownBy(() -> renders.pdf("b", List.of(run(2, "done")), () -> new byte[1]))
                .isInstanceOf(dev.driftlab.app.system.RenderGate.Busy.class)
                .hasMessageContaining("try again");
        assertThat(TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - t0)).isLessThan(1_000);

        release.countDown();
        first.join();
        assertThat(renders.pdf("b", List.of(run(2, "done")), () -> new byte[1])).hasSize(1);
    }

    @Test
    void pdf_ofFinishedRuns_madeOnce_ofRunningRuns_madeEachTime() {
        ReportRenders renders = new ReportRenders(2, 2, 1 << 20);
        AtomicInteger made = new AtomicInteger();

        renders.pdf("x", List.of(run(1, "done")), () -> new byte[made.incrementAndGet()]);
        renders.pdf("x", List.of(run(1, "done")), () -> new byte[made.incrementAndGet()]);
        renders.pdf("y", List.of(run(2, "running")), () -> new byte[made.incrementAndGet()]);
        renders.pdf("y", List.of(run(2, "running")), () -> new byte[made.incrementAndGet()]);

        assertThat(made).hasValue(3);
    }
}
