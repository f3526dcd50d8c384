package dev.driftlab.app.system.web;

import dev.driftlab.app.runs.QueueFull;
import dev.driftlab.app.runs.RunNotFound;
import dev.driftlab.app.runs.RunRefused;
import dev.driftlab.app.scenarios.RevisionConflict;
import dev.driftlab.app.scenarios.ScenarioNotFound;
import dev.driftlab.app.scenarios.ScenarioRefused;
import dev.driftlab.app.sharing.LinkNotFound;
import dev.driftlab.app.sharing.ReadOnlyLink;
import dev.driftlab.app.system.RenderGate;
import java.util.List;
import java.util.Map;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.core.Ordered;
import org.springframework.core.annotation.Order;
import org.springframework.http.HttpStatus;
import org.springframework.http.ProblemDetail;
import org.springframework.http.ResponseEntity;
import org.springframework.http.converter.HttpMessageNotReadableException;
import org.springframework.web.bind.MethodArgumentNotValidException;
import org.springframework.web.bind.MissingServletRequestParameterException;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.bind.annotation.RestController;
import org.springframework.web.bind.annotation.RestControllerAdvice;
import org.springframework.web.method.annotation.MethodArgumentTypeMismatchException;

/** Errors of the JSON API as problem documents (RFC 9457) with a plain message; never a stack trace. */
@RestControllerAdvice(annotations = RestController.class)
@Order(Ordered.HIGHEST_PRECEDENCE)
class ApiProblems {

    private static final Logger LOG = LoggerFactory.getLogger(ApiProblems.class);

    @ExceptionHandler({LinkNotFound.class, ScenarioNotFound.class, RunNotFound.class})
    ResponseEntity<ProblemDetail> notFound(RuntimeException e) {
        return problem(HttpStatus.NOT_FOUND, e.getMessage());
    }

    @ExceptionHandler(ReadOnlyLink.class)
    ResponseEntity<ProblemDetail> readOnly(ReadOnlyLink e) {
        return problem(HttpStatus.FORBIDDEN, e.getMessage());
    }

    @ExceptionHandler(RevisionConflict.class)
    ResponseEntity<ProblemDetail> conflict(RevisionConflict e) {
        ResponseEntity<ProblemDetail> r = problem(HttpStatus.CONFLICT, e.getMessage());
        r.getBody().setProperty("baseRevision", e.base());
        r.getBody().setProperty("latestRevision", e.latest());
        return r;
    }

    @ExceptionHandler(ScenarioRefused.class)
    ResponseEntity<ProblemDetail> refused(ScenarioRefused e) {
        ResponseEntity<ProblemDetail> r = problem(HttpStatus.UNPROCESSABLE_CONTENT, e.getMessage());
        List<Map<String, String>> problems = e.problems().stream()
                .map(p ->
                        Map.of("severity", p.isError() ? "error" : "warning", "path", p.path(), "message", p.message()))
                .toList();
        r.getBody().setProperty("problems", problems);
        return r;
    }

    @ExceptionHandler(dev.driftlab.app.suites.SuiteRefused.class)
    ResponseEntity<ProblemDetail> suiteRefused(dev.driftlab.app.suites.SuiteRefused e) {
        ResponseEntity<ProblemDetail> r = problem(HttpStatus.UNPROCESSABLE_CONTENT, e.getMessage());
        List<Map<String, String>> problems = e.problems().stream()
                .map(p -> Map.of("path", p.path(), "message", p.message()))
                .toList();
        r.getBody().setProperty("problems", problems);
        return r;
    }

    @ExceptionHandler(RunRefused.class)
    ResponseEntity<ProblemDetail> runRefused(RunRefused e) {
        ResponseEntity<ProblemDetail> r = problem(HttpStatus.UNPROCESSABLE_CONTENT, e.getMessage());
        r.getBody().setProperty("field", e.field());
        return r;
    }

    @ExceptionHandler(QueueFull.class)
    ResponseEntity<ProblemDetail> busy(QueueFull e) {
        ProblemDetail p = ProblemDetail.forStatusAndDetail(HttpStatus.SERVICE_UNAVAILABLE, e.getMessage());
        return ResponseEntity.status(HttpStatus.SERVICE_UNAVAILABLE)
                .header("Retry-After", "10")
                .body(p);
    }

    /** Too many expensive answers in the making: refused at once, so waiting requests never pile up. */
    @ExceptionHandler(RenderGate.Busy.class)
    ResponseEntity<ProblemDetail> rendersBusy(RenderGate.Busy e) {
        ProblemDetail p = ProblemDetail.forStatusAndDetail(HttpStatus.SERVICE_UNAVAILABLE, e.getMessage());
        return ResponseEntity.status(HttpStatus.SERVICE_UNAVAILABLE)
                .header("Retry-After", Integer.toString(RenderGate.RETRY_AFTER_SECONDS))
                .body(p);
    }

    @ExceptionHandler(MethodArgumentNotValidException.class)
    ResponseEntity<ProblemDetail> invalid(MethodArgumentNotValidException e) {
        String text = e.getBindingResult().getFieldErrors().stream()
                .map(f -> f.getField() + ": " + f.getDefaultMessage())
                .findFirst()
                .orElse("the request is not valid");
        return problem(HttpStatus.BAD_REQUEST, text);
    }

    @ExceptionHandler(MethodArgumentTypeMismatchException.class)
    ResponseEntity<ProblemDetail> mismatch(MethodArgumentTypeMismatchException e) {
        return problem(HttpStatus.BAD_REQUEST, e.getName() + ": not a valid value");
    }

    @ExceptionHandler(MissingServletRequestParameterException.class)
    ResponseEntity<ProblemDetail> missing(MissingServletRequestParameterException e) {
        return problem(HttpStatus.BAD_REQUEST, e.getParameterName() + ": required");
    }

    @ExceptionHandler(HttpMessageNotReadableException.class)
    ResponseEntity<ProblemDetail> unreadable(HttpMessageNotReadableException e) {
        if (BodySizeLimit.isTooLarge(e)) {
            return problem(HttpStatus.CONTENT_TOO_LARGE, BodySizeLimit.MESSAGE);
        }
        LOG.debug("unreadable request body", e);
        return problem(HttpStatus.BAD_REQUEST, unreadableMessage(e));
    }

    /** The body's trouble in our words with the field path; never the JSON library's own message. */
    static String unreadableMessage(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof tools.jackson.core.JacksonException j) {
                String path = dev.driftlab.scenario.JsonTrouble.path(j);
                return (path.isEmpty() ? "body" : path) + ": " + dev.driftlab.scenario.JsonTrouble.describe(j);
            }
        }
        return "body: not the JSON this address expects";
    }

    static ResponseEntity<ProblemDetail> problem(HttpStatus status, String message) {
        return ResponseEntity.status(status).body(ProblemDetail.forStatusAndDetail(status, message));
    }
}
