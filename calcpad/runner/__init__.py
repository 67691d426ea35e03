"""Running templates: executing notebooks, storing them with outputs, jobs and records."""
