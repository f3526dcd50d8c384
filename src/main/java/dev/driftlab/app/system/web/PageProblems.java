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
import jakarta.servlet.http.HttpServletResponse;
import org.springframework.core.Ordered;
import org.springframework.core.annotation.Order;
import org.springframework.http.HttpHeaders;
import org.springframework.http.HttpStatus;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.MissingServletRequestParameterException;
import org.springframework.web.bind.annotation.ControllerAdvice;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.method.annotation.MethodArgumentTypeMismatchException;
import org.springframework.web.servlet.ModelAndView;

/** Errors of the pages as a plain page (or, for htmx, its message fragment) with the right status. */
@ControllerAdvice(annotations = Controller.class)
@Order(Ordered.LOWEST_PRECEDENCE)
class PageProblems {

    @ExceptionHandler({LinkNotFound.class, ScenarioNotFound.class, RunNotFound.class})
    ModelAndView notFound(RuntimeException e) {
        return page(HttpStatus.NOT_FOUND, "Not found", e.getMessage());
    }

    @ExceptionHandler(ReadOnlyLink.class)
    ModelAndView readOnly(ReadOnlyLink e) {
        return page(HttpStatus.FORBIDDEN, "View link", e.getMessage());
    }

    @ExceptionHandler(RevisionConflict.class)
    ModelAndView conflict(RevisionConflict e) {
        return page(HttpStatus.CONFLICT, "Not saved", e.getMessage());
    }

    @ExceptionHandler(ScenarioRefused.class)
    ModelAndView refused(ScenarioRefused e) {
        ModelAndView mv = page(HttpStatus.UNPROCESSABLE_CONTENT, "Refused", e.getMessage());
        mv.addObject("problems", e.problems());
        return mv;
    }

    @ExceptionHandler(dev.driftlab.app.suites.SuiteRefused.class)
    ModelAndView suiteRefused(dev.driftlab.app.suites.SuiteRefused e) {
        ModelAndView mv = page(HttpStatus.UNPROCESSABLE_CONTENT, "Refused", e.getMessage());
        mv.addObject("problems", e.problems());
        return mv;
    }

    @ExceptionHandler(RunRefused.class)
    ModelAndView runRefused(RunRefused e) {
        return page(HttpStatus.UNPROCESSABLE_CONTENT, "Not queued", e.getMessage());
    }

    @ExceptionHandler(QueueFull.class)
    ModelAndView busy(QueueFull e, HttpServletResponse response) {
        response.setHeader("Retry-After", "10");
        return page(HttpStatus.SERVICE_UNAVAILABLE, "Busy, try later", e.getMessage());
    }

    /**
     * Too many reports (pages, PDFs, files) in the making: answered at once, so waiting requests
     * never pile up; an htmx poll that meets it is not swapped and simply polls again.
     */
    @ExceptionHandler(RenderGate.Busy.class)
    ModelAndView rendersBusy(RenderGate.Busy e, HttpServletResponse response) {
        response.setHeader(HttpHeaders.RETRY_AFTER, Integer.toString(RenderGate.RETRY_AFTER_SECONDS));
        return page(HttpStatus.SERVICE_UNAVAILABLE, "Busy, try later", e.getMessage());
    }

    @ExceptionHandler({MethodArgumentTypeMismatchException.class, MissingServletRequestParameterException.class})
    ModelAndView badRequest(Exception e) {
        String field = e instanceof MethodArgumentTypeMismatchException m
                ? m.getName()
                : ((MissingServletRequestParameterException) e).getParameterName();
        return page(HttpStatus.BAD_REQUEST, "Bad request", field + ": not a valid value");
    }

    static ModelAndView page(HttpStatus status, String title, String message) {
        ModelAndView mv = new ModelAndView("system/problem");
        mv.setStatus(status);
        mv.addObject("heading", title);
        mv.addObject("message", message);
        mv.addObject("status", status.value());
        return mv;
    }
}
