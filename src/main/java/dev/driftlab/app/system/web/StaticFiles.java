package dev.driftlab.app.system.web;

import org.springframework.context.annotation.Configuration;
import org.springframework.web.servlet.config.annotation.ResourceHandlerRegistry;
import org.springframework.web.servlet.config.annotation.WebMvcConfigurer;

/** Serves the scenario format's JSON Schema at {@code /schema/}, next to the assets under {@code /assets/}. */
@Configuration
class StaticFiles implements WebMvcConfigurer {

    @Override
    public void addResourceHandlers(ResourceHandlerRegistry registry) {
        registry.addResourceHandler("/schema/**").addResourceLocations("classpath:/static/schema/");
    }
}
