"""Tests of gf2codes.plots and the --plot options (rendered headless, no pyplot)."""

from __future__ import annotations

import builtins

import pytest

pytest.importorskip("matplotlib", reason="the plot extra (matplotlib) is not installed")

import matplotlib.image as mpimg  # noqa: E402

from gf2codes import plots  # noqa: E402
from gf2codes.cli import main  # noqa: E402
from gf2codes.decoding import bsc_performance, simulate_bsc  # noqa: E402
from gf2codes.families import extended_golay, hamming  # noqa: E402
from gf2codes.formats import write_code  # noqa: E402

PNG_MAGIC = b"\x89PNG\r\n\x1a\n"


def assert_png(path, min_w=300, min_h=200):
    data = path.read_bytes()
    assert data[:8] == PNG_MAGIC
    img = mpimg.imread(path)
    assert img.shape[0] >= min_h and img.shape[1] >= min_w


@pytest.fixture(autouse=True)
def no_catalog(monkeypatch, tmp_path):
    # never read the user's catalog: point at a file that does not exist
    monkeypatch.setenv("GF2CODES_CATALOG", str(tmp_path / "none.sqlite"))


def test_block_error_figure(tmp_path):
    ps = [1e-4, 1e-3, 1e-2, 1e-1]
    pts = bsc_performance(hamming(3), ps)
    sims = [simulate_bsc(hamming(3), p, 2000, seed=1) for p in ps]
    curve = plots.ChannelCurve("[7,4,3]", ps, [x.block_error for x in pts],
                               [x.bounded_distance_failure for x in pts],
                               [x.undetected_error for x in pts], k=4, simulated=sims)
    fig = plots.block_error_figure([curve])
    ax = fig.axes[0]
    assert ax.get_xscale() == "log" and ax.get_yscale() == "log"
    assert "crossover probability" in ax.get_xlabel()
    assert "probability" in ax.get_ylabel()
    labels = [t.get_text() for t in fig.legends[0].get_texts()]
    assert any("complete decoding" in s for s in labels)
    assert any("uncoded, 4 bits" in s for s in labels)
    out = plots.save_figure(fig, tmp_path / "ch.png")
    assert_png(out)


def test_weight_distribution_figure(tmp_path):
    fig = plots.weight_distribution_figure([1, 0, 0, 0, 0, 0, 0, 0, 759, 0, 0, 0, 2576, 0,
                                            0, 0, 759, 0, 0, 0, 0, 0, 0, 0, 1])
    ax = fig.axes[0]
    assert ax.get_yscale() == "log" and ax.get_xlabel() == "weight i"
    assert len(ax.patches) == 5  # one bar per nonzero weight
    assert_png(plots.save_figure(fig, tmp_path / "w.png"))


def test_bounds_figure_marks_known(tmp_path):
    fig = plots.bounds_figure(12, range(12, 40), mark=[(24, 8)],
                              known=[(24, 8, "Golay"), (23, 7, "")])
    ax = fig.axes[0]
    assert ax.get_xlabel() == "length n" and ax.get_ylabel() == "minimum distance d"
    labels = [t.get_text() for t in fig.legends[0].get_texts()]
    assert "best upper bound" in labels and "known codes" in labels
    assert_png(plots.save_figure(fig, tmp_path / "b.png"))


def test_catalog_points_without_catalog():
    assert plots.catalog_points(12, range(12, 30)) == []


def test_cli_plots(tmp_path, capsys):
    write_code(hamming(3), tmp_path / "h.txt")
    write_code(extended_golay(), tmp_path / "g.txt")
    assert main(["channel", str(tmp_path / "h.txt"), str(tmp_path / "g.txt"), "--p",
                 "1e-5:1e-1:5", "--plot", str(tmp_path / "c.png")]) == 0
    assert main(["verify", str(tmp_path / "g.txt"), "--plot", str(tmp_path / "v.png")]) == 0
    assert main(["bounds", "--n", "24", "--k", "12", "--plot", str(tmp_path / "b.png")]) == 0
    assert main(["bounds", "--k", "4", "--d", "3", "--plot", str(tmp_path / "b2.png")]) == 0
    for name in ("c", "v", "b", "b2"):
        assert_png(tmp_path / f"{name}.png")
    err = capsys.readouterr().err
    assert "wrote" in err


def test_bounds_plot_needs_k(tmp_path, capsys):
    assert main(["bounds", "--n", "24", "--d", "8", "--plot", str(tmp_path / "x.png")]) == 2
    assert "needs a single dimension --k" in capsys.readouterr().err


def test_missing_matplotlib(tmp_path, capsys, monkeypatch):
    real_import = builtins.__import__

    def fake_import(name, *args, **kwargs):
        if name == "matplotlib" or name.startswith("matplotlib."):
            raise ImportError("No module named 'matplotlib'")
        return real_import(name, *args, **kwargs)

    monkeypatch.setattr(builtins, "__import__", fake_import)
    write_code(hamming(3), tmp_path / "h.txt")
    status = main(["channel", str(tmp_path / "h.txt"), "--plot", str(tmp_path / "c.png")])
    err = capsys.readouterr().err
    assert status == 2 and err.count("\n") == 1
    assert "pip install 'gf2codes[plot]'" in err
    assert not (tmp_path / "c.png").exists()
