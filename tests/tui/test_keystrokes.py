"""A standard job from launch to verdict in at most 40 keystrokes (counted, not estimated)."""

from __future__ import annotations

from .conftest import plain_text, settle

KEY_BUDGET = 40


async def test_standard_job_within_forty_keys(make_app):
    """Nameplate, one V-belt pulley, a keyed round shaft as found, a square candidate from stock."""
    app = make_app()
    presses: list[str] = []

    async with app.run_test(size=(80, 24)) as pilot:

        async def press(*keys: str) -> None:
            presses.extend(keys)
            await pilot.press(*keys)

        await settle(pilot)
        await press(*"7.5", "tab", *"1460")  # power (bare = kW), speed (bare = rpm)
        await press("pagedown", "v")  # what is mounted: V-belt pulley
        await press("tab", *"200", "tab", *"60")  # pitch diameter, overhang (bare = mm)
        await press("pagedown", "tab", *"40", "tab", "k")  # shaft as found: round 40, keyed
        await press("f4", "s")  # stock finder, square bar
        await settle(pilot)  # waiting is not a keystroke
        await press("enter")  # take the smallest square that passes
        await settle(pilot)

        result = app.job_screen.result
        assert result is not None
        assert result["inputs"]["shaft"] == "round 40mm keyed"
        assert result["inputs"]["mount"] == "vbelt"
        assert result["shafts"][1]["spec"].startswith("square")
        assert result["verdict"] == "pass"  # the finder highlights the smallest clear pass
        assert "✓ PASS" in plain_text(app.job_screen.query_one("#verdict-banner"))
    assert len(presses) <= KEY_BUDGET, f"{len(presses)} keys: {presses}"
    print(f"standard job: {len(presses)} keystrokes")
