"""The PDF calculation sheet (reportlab): content and vector drawings."""
