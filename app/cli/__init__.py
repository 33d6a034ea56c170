"""Headless sub-commands of ``stagewright`` (one module each), their plain-text tables and terminal progress. Never imports Qt."""
