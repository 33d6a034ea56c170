"""Stagewright front end. Modules here that need no Qt (cli, units, charts, report) import none."""
