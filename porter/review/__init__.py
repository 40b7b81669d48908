"""The side-by-side HTML review of a conversion: `render_review(results) -> str`."""

from porter.review.render import render_review

__all__ = ["render_review"]
