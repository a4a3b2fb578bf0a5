"""Tests of the rules, one module per family (a package: its module names repeat physics')."""
