"""The assessment of one machine on one site, built from the physics and judged by the rules."""
