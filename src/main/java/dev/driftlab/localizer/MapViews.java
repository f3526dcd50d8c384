package dev.driftlab.localizer;

import java.util.Objects;

/**
 * The three views of the believed map the filter needs. The map side builds one from its grid,
 * distance field, ray caster and free-space sampler through thin adapters.
 *
 * @param distances distance field for the likelihood-field model and sensor resetting
 * @param caster ray caster for the beam model
 * @param freeSpace uniform free-space positions for global initialisation and injection
 */
public record MapViews(DistanceGrid distances, BeamCaster caster, FreeSpaceSampler freeSpace) {

    /** Checks that every view is given and the grid is well formed. */
    public MapViews {
        Objects.requireNonNull(distances, "distances");
        Objects.requireNonNull(caster, "caster");
        Objects.requireNonNull(freeSpace, "freeSpace");
        if (distances.width() < 1 || distances.height() < 1) {
            throw new IllegalArgumentException(
                    "distance grid must have at least one cell, got " + distances.width() + " x " + distances.height());
        }
        if (!(distances.cellSize() > 0) || !Double.isFinite(distances.cellSize())) {
            throw new IllegalArgumentException("distance grid cell size must be > 0, got " + distances.cellSize());
        }
        if (distances.distances().length != distances.width() * distances.height()) {
            throw new IllegalArgumentException("distance grid holds " + distances.distances().length + " values for "
                    + distances.width() + " x " + distances.height() + " cells");
        }
    }
}
