"""Service messages shown with the trade's symbols: field names must survive the translation."""

from crossrate.services.wording import with_symbols


def test_symbols_replace_words_but_not_field_names():
    text = "normal region (0 < -Delta G deg' < lambda); |Delta G deg| large; add lambda_total or lambda_in"
    assert with_symbols(text) == "normal region (0 < -ΔG°' < λ); |ΔG°| large; add lambda_total or lambda_in"
