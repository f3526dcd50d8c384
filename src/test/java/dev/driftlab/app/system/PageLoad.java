package dev.driftlab.app.system;

import java.net.InetAddress;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.concurrent.atomic.AtomicLong;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * A bounded load run against a Driftlab server on this machine: N clients loop over the pages and
 * htmx fragments for a fixed time (and at most a fixed number of requests), then per-page p50, p95
 * and p99 latencies are printed. Not part of the test suite (no {@code Test} suffix); run it by
 * hand, see the README. Refuses any address that is not loopback.
 *
 * <p>Arguments: base URL (default http://127.0.0.1:8080), clients (50), seconds (30), warm-up
 * seconds (10), request cap (200000), pause between one client's requests in ms (0: back to back;
 * 1000 is a browser polling a progress fragment).
 */
public final class PageLoad {

    private PageLoad() {}

    public static void main(String[] args) throws Exception {
        String base = args.length > 0 ? args[0] : "http://127.0.0.1:8080";
        int clients = args.length > 1 ? Integer.parseInt(args[1]) : 50;
        int seconds = args.length > 2 ? Integer.parseInt(args[2]) : 30;
        int warmup = args.length > 3 ? Integer.parseInt(args[3]) : 10;
        long cap = args.length > 4 ? Long.parseLong(args[4]) : 200_000;
        long pauseMs = args.length > 5 ? Long.parseLong(args[5]) : 0;
        URI baseUri = URI.create(base);
        if (!InetAddress.getByName(baseUri.getHost()).isLoopbackAddress()) {
            throw new IllegalArgumentException(
                    "load runs only against this machine (loopback), not " + baseUri.getHost());
        }

        HttpClient setup = HttpClient.newHttpClient();
        String list = setup.send(
                        HttpRequest.newBuilder(baseUri.resolve("/api/scenarios"))
                                .build(),
                        HttpResponse.BodyHandlers.ofString())
                .body();
        // every page measured reads through a view link, which the list gives
        Matcher m = Pattern.compile("\"viewToken\":\"([A-Za-z0-9_-]{43})\"").matcher(list);
        if (!m.find()) {
            throw new IllegalStateException("no scenario with a view link on " + base);
        }
        String token = m.group(1);
        String scenario = setup.send(
                        HttpRequest.newBuilder(baseUri.resolve("/api/s/" + token))
                                .build(),
                        HttpResponse.BodyHandlers.ofString())
                .body();
        int latest = Integer.parseInt(scenario.replaceAll("(?s).*\"latestRevision\":(\\d+).*", "$1"));

        Map<String, HttpRequest> pages = new LinkedHashMap<>();
        pages.put("home page", get(baseUri, "/"));
        pages.put("home search fragment", htmx(baseUri, "/?q=hall"));
        pages.put("scenario page", get(baseUri, "/s/" + token));
        pages.put("history page", get(baseUri, "/s/" + token + "/history"));
        pages.put("compare fragment", htmx(baseUri, "/s/" + token + "/compare?from=1&to=" + latest));
        pages.put("runs panel fragment", htmx(baseUri, "/s/" + token + "/runs"));
        pages.put("scenario API", get(baseUri, "/api/s/" + token));
        List<String> names = new ArrayList<>(pages.keySet());

        System.out.printf("warming up %d s with %d clients against %s%n", warmup, clients, base);
        drive(pages, names, clients, warmup, cap, pauseMs, new ConcurrentHashMap<>(), new AtomicLong());
        Map<String, ConcurrentLinkedQueue<Long>> samples = new ConcurrentHashMap<>();
        AtomicLong errors = new AtomicLong();
        System.out.printf(
                "measuring %d s with %d clients, %d ms between a client's requests%n", seconds, clients, pauseMs);
        long total = drive(pages, names, clients, seconds, cap, pauseMs, samples, errors);

        System.out.printf("%-22s %8s %8s %8s %8s%n", "page", "requests", "p50 ms", "p95 ms", "p99 ms");
        for (String n : names) {
            long[] ns = samples.getOrDefault(n, new ConcurrentLinkedQueue<>()).stream()
                    .mapToLong(Long::longValue)
                    .toArray();
            Arrays.sort(ns);
            System.out.printf("%-22s %8d %8.1f %8.1f %8.1f%n", n, ns.length, pct(ns, 50), pct(ns, 95), pct(ns, 99));
        }
        long[] all = samples.values().stream()
                .flatMap(q -> q.stream())
                .mapToLong(Long::longValue)
                .toArray();
        Arrays.sort(all);
        System.out.printf("%-22s %8d %8.1f %8.1f %8.1f%n", "all", all.length, pct(all, 50), pct(all, 95), pct(all, 99));
        System.out.printf("throughput %.0f requests/s, errors %d%n", total / (double) seconds, errors.get());
    }

    private static long drive(
            Map<String, HttpRequest> pages,
            List<String> names,
            int clients,
            int seconds,
            long cap,
            long pauseMs,
            Map<String, ConcurrentLinkedQueue<Long>> samples,
            AtomicLong errors)
            throws InterruptedException {
        long end = System.nanoTime() + Duration.ofSeconds(seconds).toNanos();
        AtomicLong count = new AtomicLong();
        List<Thread> threads = new ArrayList<>();
        for (int c = 0; c < clients; c++) {
            int offset = c;
            Thread t = new Thread(() -> {
                // one cookie jar per client, as a browser keeps its CSRF cookie
                HttpClient client = HttpClient.newBuilder()
                        .version(HttpClient.Version.HTTP_1_1)
                        .cookieHandler(new java.net.CookieManager())
                        .build();
                int i = offset;
                while (System.nanoTime() < end && count.incrementAndGet() <= cap) {
                    String name = names.get(i++ % names.size());
                    long t0 = System.nanoTime();
                    try {
                        HttpResponse<byte[]> r = client.send(pages.get(name), HttpResponse.BodyHandlers.ofByteArray());
                        long dt = System.nanoTime() - t0;
                        if (r.statusCode() != 200) {
                            errors.incrementAndGet();
                        }
                        samples.computeIfAbsent(name, k -> new ConcurrentLinkedQueue<>())
                                .add(dt);
                    } catch (Exception e) {
                        errors.incrementAndGet();
                    }
                    if (pauseMs > 0) {
                        try {
                            Thread.sleep(pauseMs);
                        } catch (InterruptedException e) {
                            return;
                        }
                    }
                }
            });
            t.start();
            threads.add(t);
        }
        for (Thread t : threads) {
            t.join();
        }
        return Math.min(count.get(), cap);
    }

    private static HttpRequest get(URI base, String path) {
        return HttpRequest.newBuilder(base.resolve(path))
                .timeout(Duration.ofSeconds(10))
                .build();
    }

    private static HttpRequest htmx(URI base, String path) {
        return HttpRequest.newBuilder(base.resolve(path))
                .header("HX-Request", "true")
                .timeout(Duration.ofSeconds(10))
                .build();
    }

    private static double pct(long[] sorted, int p) {
        if (sorted.length == 0) {
            return Double.NaN;
        }
        int i = (int) Math.ceil(p / 100.0 * sorted.length) - 1;
        return sorted[Math.max(0, Math.min(sorted.length - 1, i))] / 1e6;
    }
}
