"""The assessment of one machine on one site, built from the physics and judged by the rules.

:mod:`.pipeline` holds ``assess`` and ``assess_all``; :mod:`.assessment` the records they
return. This package module imports neither, so that the rules can read the records without
importing the pipeline that calls them.
"""
