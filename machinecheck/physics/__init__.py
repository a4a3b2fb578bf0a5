"""Pure physics of rotating machines: plain floats in, plain floats out, no I/O, no pint.

Each module holds one concept and each public function cites its published method.
"""
