"""Files and options turned into typed, validated records: field table, units, readers."""
