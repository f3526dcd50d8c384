package dev.driftlab.trial;

import dev.driftlab.geometry.OccupancyGrid;
import dev.driftlab.geometry.SegmentSet;
import dev.driftlab.localizer.TrialLocalizer;
import dev.driftlab.localizer.protocol.Greeting;
import dev.driftlab.localizer.protocol.Messages;
import dev.driftlab.localizer.protocol.OccupancyRows;
import dev.driftlab.localizer.protocol.ProcessLocalizer;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioJson;
import java.util.List;
import java.util.regex.Pattern;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

/**
 * Trials run by an outside program over {@code driftlab-localizer/1}, one process per trial. The
 * greeting carries the believed map at the variant's cell size, the rangefinder, the robot, the
 * start hint from the variant's start settings, and (Driftlab-specific) the variant's settings
 * with the localizer's seed, which Driftlab's own {@code localizer-stdio} needs and others may
 * ignore.
 *
 * @param command the program and its arguments
 * @param limits time limits of the exchange
 */
public record OutsideLocalizer(List<String> command, ProcessLocalizer.Limits limits) implements LocalizerSource {

    /**
     * What a server's administrator may call an outside localizer in the server's list, and so what
     * a run or a command-line client may name: lower-case letters, digits and hyphens, 1 to 40
     * characters, starting with a letter or digit. Never a command.
     */
    public static final Pattern LISTED_NAME = Pattern.compile("[a-z0-9][a-z0-9-]{0,39}");

    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    /** Copies the command. */
    public OutsideLocalizer {
        command = List.copyOf(command);
        if (command.isEmpty()) {
            throw new IllegalArgumentException("the localizer command is empty");
        }
    }

    @Override
    public TrialLocalizer open(Setup s) {
        return ProcessLocalizer.start(command, greeting(s), limits);
    }

    @Override
    public String name() {
        return String.join(" ", command);
    }

    /** The greeting a trial with this setup sends. */
    public static Greeting greeting(Setup s) {
        Scenario sc = s.scenario();
        OccupancyGrid grid = s.grid().grid();
        SegmentSet walls = s.believed().segments();
        double[][] w = new double[walls.size()][];
        for (int i = 0; i < w.length; i++) {
            w[i] = new double[] {walls.ax(i), walls.ay(i), walls.bx(i), walls.by(i)};
        }
        LocalizerSettings.Particles p = s.settings().particles();
        boolean unknown = p.start() == LocalizerSettings.Start.EVERYWHERE;
        ObjectNode settings = MAPPER.createObjectNode();
        settings.set("localizer", ScenarioJson.writeLocalizer(s.settings()));
        settings.put("seed", s.seed());
        ObjectNode start = settings.putObject("routeStart");
        start.put("x", sc.route().start().x());
        start.put("y", sc.route().start().y());
        start.put("heading", sc.route().start().heading());
        settings.put("clearance", TrialRunner.freeSpaceClearance(sc));
        return new Greeting(
                grid.cellSize(),
                grid.originX(),
                grid.originY(),
                grid.width(),
                grid.height(),
                OccupancyRows.encode(grid),
                w,
                s.beamAngles(),
                s.mount(),
                s.maxRange(),
                sc.rangefinder().rate(),
                sc.robot().wheelbase(),
                sc.robot().wheelRadius(),
                sc.robot().ticksPerTurn(),
                sc.robot().footprintRadius(),
                unknown ? null : sc.route().start(),
                unknown ? 0 : p.startSpread(),
                unknown ? 0 : p.startTurnSpread(),
                s.recording() ? Messages.MAX_PARTICLES : 0,
                settings);
    }
}
