package dev.driftlab.app.system.web;

import org.springframework.boot.autoconfigure.condition.ConditionalOnWebApplication;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;
import org.springframework.security.config.annotation.web.builders.HttpSecurity;
import org.springframework.security.config.http.SessionCreationPolicy;
import org.springframework.security.core.userdetails.UserDetailsService;
import org.springframework.security.provisioning.InMemoryUserDetailsManager;
import org.springframework.security.web.SecurityFilterChain;
import org.springframework.security.web.csrf.CookieCsrfTokenRepository;
import org.springframework.security.web.header.writers.ReferrerPolicyHeaderWriter.ReferrerPolicy;

/**
 * Access is by link token, not by login, so every request is let through here and each controller
 * checks the token it is given. What this adds: CSRF protection on the browser forms (kept in a
 * cookie, so pages need no server session), no referrer (links carry tokens) and a strict content
 * security policy. A worker process serves no pages and has none of this.
 */
@Configuration
@ConditionalOnWebApplication
public class SecurityConfig {

    static final String CONTENT_SECURITY_POLICY =
            "default-src 'self'; script-src 'self'; style-src 'self' 'unsafe-inline';"
                    + " img-src 'self' data:; object-src 'none'; base-uri 'self'; form-action 'self'; frame-ancestors 'none'";

    @Bean
    SecurityFilterChain filterChain(HttpSecurity http) throws Exception {
        CookieCsrfTokenRepository csrfTokens = new CookieCsrfTokenRepository();
        csrfTokens.setCookieCustomizer(c -> c.sameSite("Strict"));
        http.authorizeHttpRequests(a -> a.anyRequest().permitAll())
                // the API is called by CI jobs with the token in the path and no cookies, so a
                // forged cross-site request has nothing to ride on
                .csrf(c -> c.csrfTokenRepository(csrfTokens).ignoringRequestMatchers("/api/**"))
                .headers(h -> h.contentSecurityPolicy(p -> p.policyDirectives(CONTENT_SECURITY_POLICY))
                        .referrerPolicy(r -> r.policy(ReferrerPolicy.NO_REFERRER)))
                .sessionManagement(s -> s.sessionCreationPolicy(SessionCreationPolicy.STATELESS))
                .requestCache(c -> c.disable())
                .formLogin(f -> f.disable())
                .httpBasic(b -> b.disable())
                .logout(l -> l.disable());
        return http.build();
    }

    /** No user accounts: an empty store stops the generated default password. */
    @Bean
    UserDetailsService noUsers() {
        return new InMemoryUserDetailsManager();
    }
}
