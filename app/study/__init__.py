"""The staging study front to back in the window.

Qt-free: ``job`` (the request, running it, the plain-data answer) · ``apply`` (an option's stage
list for Apply; is a study still current) · ``display`` (table columns and cells, limit messages,
case names, site-variable values).

Qt: ``worker`` (StudyController: the study thread, progress, cancel) · ``panel`` (StudyPanel, the
dock: composes the three pieces below, runs the study, keeps its answer, publishes its messages)
· ``controls`` (inputs, Run/Cancel, progress and status, Apply) · ``options_table`` (the options
table: cells, the picked option, whether it can be applied) · ``chart_view`` (the staging chart
canvas and toolbar) · ``ops`` (StudyLink: the panel's runs in the status bar). The study is shown
in its panel only (Train ▸ Run staging study raises it).
"""
