"""Self-contained HTML building blocks: tables, embedded PNG figures, one-file documents.

Documents carry their style inline and their figures as ``data:image/png;base64`` URIs: no
script, style sheet, font or image is fetched from anywhere, so a report can be mailed or
archived as a single file.
"""

from __future__ import annotations

import base64
import html
import io
from collections.abc import Sequence
from typing import Any

from micromech.errors import InputError

__all__ = ["CSS", "escape", "figure_png", "html_document", "html_table", "png_data_uri",
           "image_tag"]

#: Inline style of every report.
CSS = """
body { font-family: sans-serif; margin: 2em auto; max-width: 70em; color: #222;
       line-height: 1.4; padding: 0 1em; }
h1 { font-size: 1.5em; } h2 { font-size: 1.2em; margin-top: 1.6em; }
table { border-collapse: collapse; margin: 0.8em 0; }
th, td { border: 1px solid #bbb; padding: 0.25em 0.6em; text-align: left; vertical-align: top; }
th { background: #eee; }
td.num { text-align: right; font-variant-numeric: tabular-nums; }
.caution { border: 2px solid #b36b00; background: #fff6e5; padding: 0.6em 1em; }
.consistent { color: #1a7f37; font-weight: bold; }
.suspect { color: #9a6700; font-weight: bold; }
.violates_bounds { color: #cf222e; font-weight: bold; }
figure { display: inline-block; margin: 0.5em; max-width: 100%; }
img { max-width: 100%; height: auto; }
figcaption { font-size: 0.9em; color: #555; }
"""


def escape(text: object) -> str:
    """Escape text for HTML content and attribute values.

    Parameters
    ----------
    text : object
        Content (converted with ``str``).

    Returns
    -------
    str
        The escaped text.
    """
    return html.escape(str(text), quote=True)


def png_data_uri(png: bytes) -> str:
    """Return a ``data:image/png;base64,...`` URI for PNG bytes.

    Parameters
    ----------
    png : bytes
        A PNG file's content.

    Returns
    -------
    str
        The URI.

    Raises
    ------
    InputError
        If the bytes do not start with the PNG signature.
    """
    if not png.startswith(b"\x89PNG\r\n\x1a\n"):
        raise InputError("png_data_uri expects PNG bytes (signature missing)")
    return "data:image/png;base64," + base64.b64encode(png).decode("ascii")


def image_tag(png: bytes, alt: str, caption: str | None = None) -> str:
    """Embed a figure: ``<figure><img src="data:..."></figure>``.

    Parameters
    ----------
    png : bytes
        PNG content.
    alt : str
        Alternative text.
    caption : str, optional
        Caption under the image.

    Returns
    -------
    str
        HTML.
    """
    cap = f"<figcaption>{escape(caption)}</figcaption>" if caption else ""
    return f'<figure><img src="{png_data_uri(png)}" alt="{escape(alt)}">{cap}</figure>'


def html_table(
    headers: Sequence[str],
    rows: Sequence[Sequence[Any]],
    *,
    numeric: Sequence[bool] | None = None,
    cell_class: Sequence[Sequence[str | None]] | None = None,
) -> str:
    """Format an HTML table; every cell is escaped.

    Parameters
    ----------
    headers : sequence of str
        Column headers.
    rows : sequence of sequences
        Cell contents.
    numeric : sequence of bool, optional
        Per column: right-align as a number.
    cell_class : sequence of sequences of str or None, optional
        Per cell: a CSS class (e.g. the verdict).

    Returns
    -------
    str
        HTML.

    Raises
    ------
    InputError
        If a row has a different number of cells than the headers.
    """
    n = len(headers)
    num = list(numeric) if numeric is not None else [False] * n
    out = ["<table>", "<tr>" + "".join(f"<th>{escape(h)}</th>" for h in headers) + "</tr>"]
    for i, row in enumerate(rows):
        if len(row) != n:
            raise InputError(f"row {i + 1} has {len(row)} cells; the table has {n} columns")
        cells = []
        for j, c in enumerate(row):
            classes = []
            if num[j]:
                classes.append("num")
            if cell_class is not None and cell_class[i][j]:
                classes.append(str(cell_class[i][j]))
            attr = f' class="{" ".join(classes)}"' if classes else ""
            cells.append(f"<td{attr}>{escape(c)}</td>")
        out.append("<tr>" + "".join(cells) + "</tr>")
    out.append("</table>")
    return "\n".join(out)


def html_document(title: str, body: str, *, caution: str) -> str:
    """Build a complete self-contained HTML page with the caution at its top and bottom.

    Parameters
    ----------
    title : str
        Page title (escaped).
    body : str
        HTML of the content (already escaped where needed).
    caution : str
        The caution sentence (escaped).

    Returns
    -------
    str
        The document.
    """
    box = f'<p class="caution"><strong>Caution.</strong> {escape(caution)}</p>'
    return (
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
        f"<title>{escape(title)}</title>\n<style>{CSS}</style>\n</head>\n<body>\n"
        f"<h1>{escape(title)}</h1>\n{box}\n{body}\n{box}\n</body>\n</html>\n"
    )


def figure_png(fig: Any, dpi: int = 100) -> bytes:
    """Render a matplotlib figure to PNG bytes.

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        The figure.
    dpi : int
        Resolution.

    Returns
    -------
    bytes
        The PNG.
    """
    buf = io.BytesIO()
    fig.savefig(buf, format="png", dpi=dpi, metadata={"Software": None})
    return buf.getvalue()
