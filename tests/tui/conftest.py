"""Shared helpers for the workbench tests: a settled app and a key counter."""

from __future__ import annotations

import asyncio
import inspect

import pytest

from workbench.tui.app import ShaftbenchApp


async def settle(pilot, rounds: int = 3) -> None:
    """Wait past the sheet's debounce and for every worker, a few times (results chain)."""
    for _ in range(rounds):
        await pilot.pause(0.2)
        await pilot.app.workers.wait_for_complete()
    await pilot.pause()


def plain_text(widget) -> str:
    """What a Static shows, as plain text (Rich renderables rendered without colour)."""
    import io

    from rich.console import Console
    from rich.text import Text

    content = widget.content
    if isinstance(content, str):
        return content
    if isinstance(content, Text):
        return content.plain
    console = Console(width=200, record=True, file=io.StringIO(), color_system=None)
    console.print(content)
    return console.export_text()


@pytest.fixture
def make_app(tmp_path):
    """Build a workbench app whose job log lives in the test's temporary folder."""

    def build(**kwargs) -> ShaftbenchApp:
        kwargs.setdefault("log_path", str(tmp_path / "jobs.sqlite3"))
        return ShaftbenchApp(**kwargs)

    return build


@pytest.hookimpl(tryfirst=True)
def pytest_pyfunc_call(pyfuncitem):
    """Run ``async def`` tests in a fresh event loop (no asyncio plugin is needed)."""
    if not inspect.iscoroutinefunction(pyfuncitem.obj):
        return None
    names = pyfuncitem._fixtureinfo.argnames
    asyncio.run(pyfuncitem.obj(**{name: pyfuncitem.funcargs[name] for name in names}))
    return True
