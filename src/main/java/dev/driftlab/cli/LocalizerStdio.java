package dev.driftlab.cli;

import dev.driftlab.geometry.FreeSpace;
import dev.driftlab.geometry.GridMap;
import dev.driftlab.geometry.OccupancyGrid;
import dev.driftlab.geometry.Pose;
import dev.driftlab.localizer.MonteCarloLocalizer;
import dev.driftlab.localizer.Scan;
import dev.driftlab.localizer.UpdateReport;
import dev.driftlab.localizer.protocol.Greeting;
import dev.driftlab.localizer.protocol.Messages;
import dev.driftlab.localizer.protocol.OccupancyRows;
import dev.driftlab.localizer.protocol.ProtocolException;
import dev.driftlab.scenario.LocalizerSettings;
import dev.driftlab.scenario.ScenarioException;
import dev.driftlab.scenario.ScenarioJson;
import dev.driftlab.trial.MapAdapters;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.OutputStream;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import tools.jackson.databind.JsonNode;

/**
 * The {@code localizer-stdio} command: Driftlab's own Monte Carlo localizer behind {@code
 * driftlab-localizer/1} on standard input and output. It needs the greeting's Driftlab-specific
 * {@code settings} (the variant's settings, the seed, the route start and the free-space
 * clearance); given the same, it answers exactly what the built-in localizer computes in process.
 */
final class LocalizerStdio {

    /** The name this localizer gives in its hello. */
    static final String NAME = "driftlab built-in Monte Carlo localizer";

    private LocalizerStdio() {}

    /**
     * Serves one trial.
     *
     * @return exit status: 0 after the end message or the end of input, 2 for a greeting it cannot use
     */
    static int serve(InputStream stdin, OutputStream stdout, PrintStream err) {
        BufferedReader in = new BufferedReader(new InputStreamReader(stdin, StandardCharsets.UTF_8));
        PrintWriter out = new PrintWriter(new java.io.OutputStreamWriter(stdout, StandardCharsets.UTF_8), false);
        try {
            String first = in.readLine();
            if (first == null) {
                err.println("driftlab localizer-stdio: no greeting on standard input");
                return Cli.BAD_INPUT;
            }
            Greeting g;
            MonteCarloLocalizer filter;
            try {
                g = Messages.readGreeting(Messages.parse(first));
                filter = filter(g);
            } catch (ProtocolException | IllegalArgumentException e) {
                err.println("driftlab localizer-stdio: " + e.getMessage());
                out.println(Messages.refused(e.getMessage()));
                out.flush();
                return Cli.BAD_INPUT;
            }
            try (filter) {
                out.println(Messages.hello(NAME));
                out.flush();
                Pose odometry = null;
                String line;
                while ((line = in.readLine()) != null) {
                    if (line.isBlank()) {
                        continue;
                    }
                    JsonNode m = Messages.parse(line);
                    switch (Messages.type(m)) {
                        case Messages.ODOMETRY -> odometry = Messages.readOdometryPose(m);
                        case Messages.SCAN -> {
                            if (odometry == null) {
                                throw new ProtocolException(
                                        dev.driftlab.localizer.LocalizerFailure.Kind.MALFORMED,
                                        "a scan came before any odometry");
                            }
                            Scan scan = Scan.of(Messages.readRanges(m), g.beamAngles(), g.mount(), g.maxRange());
                            UpdateReport r = filter.update(odometry, scan);
                            out.println(Messages.estimate(Messages.readTime(m), r, filter.particles(), g.particles()));
                            out.flush();
                        }
                        case Messages.END -> {
                            return Cli.OK;
                        }
                        default ->
                            err.println("driftlab localizer-stdio: ignoring a \"" + Messages.type(m) + "\" message");
                    }
                }
                return Cli.OK;
            }
        } catch (ProtocolException e) {
            err.println("driftlab localizer-stdio: " + e.getMessage());
            return Cli.BAD_INPUT;
        } catch (IOException e) {
            err.println("driftlab localizer-stdio: " + e.getMessage());
            return Cli.BAD_INPUT;
        }
    }

    /** The filter the greeting describes, started as the built-in localizer starts. */
    private static MonteCarloLocalizer filter(Greeting g) {
        JsonNode s = g.settings();
        if (s == null
                || !s.path("localizer").isObject()
                || !s.path("routeStart").isObject()) {
            throw new IllegalArgumentException(
                    "greeting.settings (Driftlab-specific: localizer, seed, routeStart, clearance) is missing;"
                            + " localizer-stdio runs Driftlab's own localizer with a scenario's settings");
        }
        LocalizerSettings settings;
        try {
            settings = ScenarioJson.readLocalizer(
                    s.path("localizer"), "greeting.settings.localizer", g.beamAngles().length);
        } catch (ScenarioException e) {
            throw new IllegalArgumentException(e.problems().get(0).toString());
        }
        OccupancyGrid grid = OccupancyGrid.of(
                g.originX(),
                g.originY(),
                g.cellSize(),
                g.width(),
                g.height(),
                OccupancyRows.decode(g.rows(), g.width()));
        GridMap map = GridMap.of(grid);
        JsonNode rs = s.path("routeStart");
        Pose start = Pose.of(
                rs.path("x").asDouble(),
                rs.path("y").asDouble(),
                rs.path("heading").asDouble());
        FreeSpace free = map.freeSpace(start.x(), start.y(), s.path("clearance").asDouble());
        MonteCarloLocalizer filter = new MonteCarloLocalizer(
                settings, MapAdapters.views(map, free), s.path("seed").asLong(), 1);
        filter.initialize(start);
        return filter;
    }
}
