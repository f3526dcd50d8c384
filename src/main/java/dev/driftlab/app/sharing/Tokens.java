package dev.driftlab.app.sharing;

import java.security.SecureRandom;
import java.util.Base64;
import java.util.regex.Pattern;

/** Unguessable link tokens: 256 bits from {@link SecureRandom}, base64url without padding. */
public final class Tokens {

    private static final SecureRandom RANDOM = new SecureRandom();
    private static final int BYTES = 32;
    private static final Pattern SHAPE = Pattern.compile("[A-Za-z0-9_-]{43}");

    private Tokens() {}

    /** A fresh token of 43 URL-safe characters. */
    public static String next() {
        byte[] b = new byte[BYTES];
        RANDOM.nextBytes(b);
        return Base64.getUrlEncoder().withoutPadding().encodeToString(b);
    }

    /** Whether a string could be a token at all; anything else is answered 404 without a lookup. */
    public static boolean wellFormed(String s) {
        return s != null && SHAPE.matcher(s).matches();
    }
}
