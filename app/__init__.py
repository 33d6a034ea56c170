"""Stagewright front end, grouped by surface and feature.

``entry`` (the console script) · ``cli/`` headless sub-commands · ``document/`` the Qt-free project
model, field specs, display preferences and recovery file · ``presentation/`` units and the
presentation tables every output reads, cautions, notes · ``window/`` main window, actions, editor,
undo commands, file/export/recovery operations · ``jobs/`` worker threads · ``panels/`` the dockable
panels · ``study/`` and ``year/`` those features front to back · ``charts/`` and ``report/`` figures and
the hand-over report (no Qt) · ``widgets/`` entry fields. The import-linter contracts in
``pyproject.toml`` state which may import which.
"""
