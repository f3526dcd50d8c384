package dev.driftlab.report;

import java.lang.reflect.InvocationTargetException;
import java.lang.reflect.Method;
import java.lang.reflect.Modifier;
import org.thymeleaf.context.IExpressionContext;
import org.thymeleaf.standard.expression.IStandardVariableExpression;
import org.thymeleaf.standard.expression.IStandardVariableExpressionEvaluator;
import org.thymeleaf.standard.expression.StandardExpressionExecutionContext;

/**
 * Evaluates the report templates' {@code ${...}} expressions: a variable, then calls of public
 * methods without arguments ({@code ${v.gates()}}, {@code ${rows.isEmpty()}}). Thymeleaf's own
 * evaluator needs OGNL, which Spring Boot leaves off the class path (the web app evaluates with
 * SpEL), and SpEL would bring Spring into the core; the templates only format a finished
 * {@link ReportView}, so method calls are all they need. Anything else is refused by name.
 */
final class ReportExpressions implements IStandardVariableExpressionEvaluator {

    @Override
    public Object evaluate(
            IExpressionContext context,
            IStandardVariableExpression expression,
            StandardExpressionExecutionContext expContext) {
        String text = expression.getExpression().strip();
        String[] parts = text.split("\\.");
        if (!context.containsVariable(parts[0])) {
            throw new IllegalArgumentException("report template: no variable \"" + parts[0] + "\" in ${" + text + "}");
        }
        Object value = context.getVariable(parts[0]);
        for (int i = 1; i < parts.length; i++) {
            String call = parts[i].strip();
            if (!call.endsWith("()") || value == null) {
                throw new IllegalArgumentException(
                        "report template: only calls like name() are read, in ${" + text + "}");
            }
            value = call(value, call.substring(0, call.length() - 2), text);
        }
        return value;
    }

    private static Object call(Object target, String name, String text) {
        Method m = publicMethod(target.getClass(), name);
        if (m == null) {
            throw new IllegalArgumentException("report template: no method " + name + "() in ${" + text + "}");
        }
        try {
            return m.invoke(target);
        } catch (IllegalAccessException e) {
            throw new IllegalStateException("report template: " + name + "() is not accessible", e);
        } catch (InvocationTargetException e) {
            if (e.getCause() instanceof RuntimeException re) {
                throw re;
            }
            throw new IllegalStateException(e.getCause());
        }
    }

    /**
     * The method as declared by a public type: a list from {@code List.of} is of a JDK-internal
     * class whose own methods cannot be called from outside java.base, but those of List can.
     */
    private static Method publicMethod(Class<?> c, String name) {
        for (Class<?> k = c; k != null; k = k.getSuperclass()) {
            if (Modifier.isPublic(k.getModifiers()) && k.getModule().isExported(k.getPackageName())) {
                Method m = declared(k, name);
                if (m != null) {
                    return m;
                }
            }
            for (Class<?> i : k.getInterfaces()) {
                Method m = publicMethod(i, name);
                if (m != null) {
                    return m;
                }
            }
        }
        return null;
    }

    private static Method declared(Class<?> k, String name) {
        try {
            Method m = k.getMethod(name);
            return Modifier.isPublic(m.getDeclaringClass().getModifiers()) ? m : null;
        } catch (NoSuchMethodException e) {
            return null;
        }
    }
}
