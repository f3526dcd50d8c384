package dev.driftlab.app.system.web;

import jakarta.servlet.http.HttpServletRequest;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.http.ProblemDetail;
import org.springframework.http.converter.HttpMessageNotReadableException;
import org.springframework.web.bind.annotation.ControllerAdvice;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.multipart.MaxUploadSizeExceededException;
import org.springframework.web.servlet.ModelAndView;
import org.springframework.web.servlet.view.json.JacksonJsonView;

/**
 * Oversize uploads fail before any controller is chosen, so this advice applies to every request
 * and picks the answer's form from the path.
 */
@ControllerAdvice
class UploadLimits {

    static final String MESSAGE = "file: larger than the 2 MB upload limit; nothing was stored.";

    /** The message naming the upload's field: the editor's import takes an image, the rest a file. */
    static String message(HttpServletRequest request) {
        return request.getRequestURI().endsWith(BodySizeLimit.EDITOR_IMPORT)
                ? MESSAGE.replaceFirst("^file:", "image:")
                : MESSAGE;
    }

    /** In the client's form by {@link BodySizeLimit#wantsJson}, the one rule for every 413. */
    @ExceptionHandler(MaxUploadSizeExceededException.class)
    ModelAndView tooLarge(HttpServletRequest request) {
        String message = message(request);
        if (BodySizeLimit.wantsJson(request)) {
            JacksonJsonView json = new JacksonJsonView();
            json.setContentType(MediaType.APPLICATION_PROBLEM_JSON_VALUE);
            json.setExtractValueFromSingleKeyModel(true);
            ModelAndView mv = new ModelAndView(json);
            mv.setStatus(HttpStatus.CONTENT_TOO_LARGE);
            mv.addObject("problem", ProblemDetail.forStatusAndDetail(HttpStatus.CONTENT_TOO_LARGE, message));
            return mv;
        }
        return PageProblems.page(HttpStatus.CONTENT_TOO_LARGE, "Too large", message);
    }

    /**
     * A page's request body that did not read: past the counted limit it is 413 in the form its
     * client reads (the API's own bodies are answered by {@link ApiProblems}).
     */
    @ExceptionHandler(HttpMessageNotReadableException.class)
    ModelAndView unreadable(HttpMessageNotReadableException e, HttpServletRequest request) {
        boolean large = BodySizeLimit.isTooLarge(e);
        HttpStatus status = large ? HttpStatus.CONTENT_TOO_LARGE : HttpStatus.BAD_REQUEST;
        String message = large ? BodySizeLimit.MESSAGE : "body: not the JSON this address expects";
        if (BodySizeLimit.wantsJson(request)) {
            JacksonJsonView json = new JacksonJsonView();
            json.setContentType(MediaType.APPLICATION_PROBLEM_JSON_VALUE);
            json.setExtractValueFromSingleKeyModel(true);
            ModelAndView mv = new ModelAndView(json);
            mv.setStatus(status);
            mv.addObject("problem", ProblemDetail.forStatusAndDetail(status, message));
            return mv;
        }
        return PageProblems.page(status, large ? "Too large" : "Bad request", message);
    }
}
