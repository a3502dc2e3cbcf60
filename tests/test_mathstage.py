"""KaTeX staged from its npm package into a built site (sitebuild/mathstage.py)."""

import json
import os
import re

import pytest

from sitebuild.mathstage import KATEX_SRC, StageError, katex_version, stage_katex, woff2_only

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


def test_woff2_only_keeps_the_woff2_source_of_every_font_rule():
    css = ('@font-face{font-family:A;src:url(fonts/A.woff2) format("woff2"),url(fonts/A.woff) format("woff"),'
           'url(fonts/A.ttf) format("truetype")}.x{color:red}')
    assert woff2_only(css) == '@font-face{font-family:A;src:url(fonts/A.woff2) format("woff2")}.x{color:red}'
    with pytest.raises(StageError, match="no WOFF2"):
        woff2_only('@font-face{src:url(fonts/A.ttf) format("truetype")}')


def test_the_staged_copy_is_the_pinned_package_with_the_fonts_its_stylesheet_names(tmp_path):
    with open(os.path.join(ROOT, "package.json"), encoding="utf-8") as fh:
        pinned = json.load(fh)["dependencies"]["katex"]
    assert katex_version() == pinned
    staged = stage_katex(str(tmp_path))
    site = tmp_path / "katex"
    css = (site / "katex.min.css").read_text(encoding="utf-8")
    named = {"katex/" + u for u in re.findall(r"url\(([^)]+)\)", css)}
    assert named and all(u.endswith(".woff2") for u in named)
    assert set(staged) == {"katex/katex.min.js", "katex/katex.min.css", "katex/LICENSE"} | named
    for rel in staged:
        assert (tmp_path / rel).is_file(), rel
    # the script is the package's own bytes
    with open(os.path.join(KATEX_SRC, "dist", "katex.min.js"), "rb") as fh:
        assert (site / "katex.min.js").read_bytes() == fh.read()
    # staging again replaces the copy (no stale file from an older version stays)
    (site / "fonts" / "old.woff2").write_bytes(b"x")
    assert stage_katex(str(tmp_path)) == staged and not (site / "fonts" / "old.woff2").exists()


def test_a_missing_package_is_a_clear_error(tmp_path):
    with pytest.raises(StageError, match="npm ci"):
        katex_version(str(tmp_path / "nowhere"))
