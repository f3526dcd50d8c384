package dev.driftlab.scenario;

/**
 * An opening in a room's wall, placed by wall index and the distance of its centre along that
 * wall.
 *
 * @param id unique id within the site plan
 * @param room id of the room whose wall holds the door
 * @param wall index of the wall (edge) in the room outline, from 0
 * @param along distance in metres from the wall's first corner to the door's centre
 * @param width clear width in metres
 * @param mapped state the believed map shows
 * @param actual state in the real world at the start of a run
 */
public record Door(String id, String room, int wall, double along, double width, DoorState mapped, DoorState actual) {
    /** Checks presence and finiteness; ranges are checked by the validator. */
    public Door {
        Checks.present(id, "id");
        Checks.present(room, "room");
        Checks.finite(along, "along");
        Checks.finite(width, "width");
        Checks.present(mapped, "mapped");
        Checks.present(actual, "actual");
    }
}
