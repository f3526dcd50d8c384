package dev.driftlab.sim;

import java.util.ArrayList;
import java.util.List;

/** Keeps everything a run streams, for tests. */
final class Recorder implements SimListener {
    final List<SimStep> steps = new ArrayList<>();
    final List<RangeScan> scans = new ArrayList<>();
    final List<SimEvent> events = new ArrayList<>();

    @Override
    public void onStep(SimStep step) {
        steps.add(step);
    }

    @Override
    public void onScan(RangeScan scan) {
        scans.add(scan);
    }

    @Override
    public void onEvent(SimEvent event) {
        events.add(event);
    }

    SimStep last() {
        return steps.get(steps.size() - 1);
    }

    List<SimEvent> events(EventKind kind) {
        return events.stream().filter(e -> e.kind() == kind).toList();
    }
}
