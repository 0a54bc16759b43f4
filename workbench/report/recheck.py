"""The wording of a recheck: whether today's program agrees with a stored job (the CLI's
``log show`` and the workbench's log review both print it)."""

from __future__ import annotations

from typing import Any


def recheck_text(reopened: Any) -> Any:
    """A plain statement of whether today's program agrees with a stored job (Rich Text).

    ``reopened`` is a ``workbench.store.Reopened``; user text in it is shown literally, never as markup.
    """
    from rich.text import Text

    from workbench.report.jobcard import literal

    if reopened.new_result is None:
        return Text.assemble(("Today's program rejects these inputs: ", "bold red"), literal(reopened.error))
    if not reopened.differences:
        return Text("Recomputed today: same verdict and figures as stored.", style="green")
    text = Text(f"Recomputed today: {len(reopened.differences)} figure(s) differ from the stored result "
                f"(saved by version {reopened.record.program_version}):\n", style="bold yellow")
    for diff in reopened.differences:
        text.append_text(literal(f"  {diff}\n"))
    return text
