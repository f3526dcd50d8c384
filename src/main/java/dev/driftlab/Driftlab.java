package dev.driftlab;

public final class Driftlab {
    public static void main(String[] args) {}
}
