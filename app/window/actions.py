"""Every command of the window, declared once: id, text, shortcut, icon, tip, handler.

The main window turns these into QActions and menus; panels reuse the same QActions on
their own toolbars. ``handler`` is ``"target.method"``, where target is ``window``, one of the
window's controllers (``files``: :mod:`stagewright.gui.window.file_ops`, ``exports``: :mod:`stagewright.gui.window.export_ops`)
or a panel id (``train``, ``study`` …); it is resolved with ``getattr`` on objects the window owns
(never ``eval``).
"""
from __future__ import annotations

__all__ = ["ActionSpec", "ACTIONS", "MENUS", "TOOLBAR"]

from dataclasses import dataclass


@dataclass(frozen=True)
class ActionSpec:
    id: str
    text: str
    handler: str
    shortcut: str = ""  #: a QKeySequence.StandardKey name ("Save") or a key string ("Ctrl+Shift+N")
    icon: str = ""  #: an SVG in icons/, or "std:SP_..." for a Qt standard icon
    tip: str = ""
    checkable: bool = False
    short: str = ""  #: toolbar text when it differs from the menu text


ACTIONS = [
    ActionSpec("file.new", "&New", "files.new_project", "New", "std:SP_FileIcon", "Start a new project"),
    ActionSpec("file.open", "&Open…", "files.open_dialog", "Open", "std:SP_DialogOpenButton",
               "Open a project file"),
    ActionSpec("file.save", "&Save", "files.save", "Save", "std:SP_DialogSaveButton", "Save the project"),
    ActionSpec("file.save_as", "Save &As…", "files.save_as", "SaveAs", "", "Save under another name"),
    ActionSpec("file.revert", "&Revert to Saved", "files.revert", "", "", "Discard changes since the last save"),
    ActionSpec("file.export", "&Export Report…", "exports.export_report_dialog", "Ctrl+E", "",
               "Write the PDF report (and the CSV balance sheet) of the current results"),
    ActionSpec("file.keep_results", "&Keep Results in File", "files.set_keep_results", "", "",
               "Save the shown results with the project; on opening they show at once and are checked by a "
               "new solve", True),
    ActionSpec("file.quit", "&Quit", "window.close", "Quit"),
    ActionSpec("train.add_stage", "Add stage", "train.add_stage", "Ctrl+Shift+A", "stage_add",
               "Add a stage at the end of the train (a copy of the last one)"),
    ActionSpec("train.insert_stage", "Insert stage", "train.insert_stage", "Ctrl+Shift+I", "stage_insert",
               "Insert a stage before the selected one"),
    ActionSpec("train.duplicate_stage", "Duplicate stage", "train.duplicate_stage", "Ctrl+Shift+D",
               "stage_duplicate", "Copy the selected stage, with its cooler, right after it"),
    ActionSpec("train.remove_stage", "Remove stage", "train.remove_stage", "Ctrl+Shift+Backspace",
               "stage_remove", "Remove the selected stage and its cooler"),
    ActionSpec("train.move_up", "Move stage up", "train.move_up", "Ctrl+Shift+Up", "move_up",
               "Move the selected stage one place towards the intake"),
    ActionSpec("train.move_down", "Move stage down", "train.move_down", "Ctrl+Shift+Down", "move_down",
               "Move the selected stage one place towards the delivery"),
    ActionSpec("train.toggle_cooler", "Add cooler", "train.toggle_cooler", "Ctrl+Shift+C", "cooler",
               "Add or remove the cooler after the selected stage"),
    ActionSpec("train.solve", "Solve now", "window.solve_now", "F5", "", "Solve the train again now"),
    ActionSpec("train.study", "Run staging study", "study.run_study", "F6", "run_study",
               "Compare 1 to N stages, each at its best split within the stage limits", False, "Run study"),
    ActionSpec("train.study_cancel", "Cancel staging study", "study.cancel_study", "", "std:SP_BrowserStop",
               "Stop the running staging study (the options finished so far are kept)", short="Cancel"),
    ActionSpec("train.study_apply", "Apply selected option", "study.apply_selected", "",
               "std:SP_DialogApplyButton",
               "Put the selected option's stages and pressure ratios into the project (one undo step)"),
    ActionSpec("train.study_keep_case", "Keep selected option as a case", "study.keep_selected_as_case", "",
               "", "Add the selected option to the project as a new case (one undo step); the case shown stays "
                   "as it is", short="Keep as case"),
    ActionSpec("view.us_units", "US customary units", "window.set_us_units", "Ctrl+U", "",
               "Show every field and table in US customary units (the project stays in SI)", True,
               "US units"),
    ActionSpec("view.gauge", "Gauge pressures", "window.set_gauge", "", "",
               "Show pressures relative to the site barometric pressure", True),
    ActionSpec("view.reset_layout", "Reset panel layout", "window.reset_layout"),
    ActionSpec("help.cautions", "Safety cautions…", "window.show_cautions", "HelpContents", "",
               "Discharge temperature, pressure vessels, hot surfaces, condensate"),
    ActionSpec("help.about", "About Stagewright", "window.show_about"),
]

#: menu title -> action ids; "-" is a separator, "@recent" the recent-files submenu,
#: "@undo" / "@redo" the undo stack's actions, "@panels" the panel toggles
MENUS = {
    "&File": ["file.new", "file.open", "@recent", "-", "file.save", "file.save_as", "file.revert",
              "file.keep_results", "-", "file.export", "-", "file.quit"],
    "&Edit": ["@undo", "@redo"],
    "&Train": ["train.add_stage", "train.insert_stage", "train.duplicate_stage", "train.remove_stage", "-",
               "train.move_up", "train.move_down", "-", "train.toggle_cooler", "-", "train.solve", "-",
               "train.study", "train.study_cancel", "train.study_apply", "train.study_keep_case"],
    "&View": ["view.us_units", "view.gauge", "-", "@panels", "-", "view.reset_layout"],
    "&Help": ["help.cautions", "-", "help.about"],
}

TOOLBAR = ["file.new", "file.open", "file.save", "-", "@undo", "@redo", "-", "train.add_stage",
           "train.remove_stage", "train.toggle_cooler", "-", "train.study", "-", "view.us_units"]
