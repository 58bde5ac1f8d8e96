"""The split of a semiclassical lambda into lambda_s and lambda_v: delta-method SEs, log-scale intervals and
when the split is called determined."""

import math

import numpy as np
import pytest

from crossrate.services.series_split import SPLIT_TOLERANCE, lambda_split, split_statement


def test_delta_method_and_log_interval():
    # lambda = 80 kJ/mol (SE 1), phi = 0.5 (SE 0.01), uncorrelated: lambda_s = lambda (1 - phi) = 40,
    # SE^2 = (1 - phi)^2 1^2 + lambda^2 0.01^2 = 0.25 + 0.64 = 0.89 (delta method, common practice);
    # the 95 % interval 40 exp(+-1.96 sqrt(0.89) / 40).
    s = lambda_split(80.0, 0.5, np.diag([1.0, 1e-4]), favoured=True)
    assert s.lambda_s == pytest.approx(40.0, rel=1e-12) and s.lambda_v == pytest.approx(40.0, rel=1e-12)
    assert s.lambda_s_se == pytest.approx(math.sqrt(0.89), rel=1e-12)
    assert s.lambda_v_se == pytest.approx(math.sqrt(0.89), rel=1e-12)
    r = 1.96 * math.sqrt(0.89) / 40.0
    assert s.lambda_s_95 == pytest.approx((40.0 * math.exp(-r), 40.0 * math.exp(r)), rel=1e-12)
    assert s.determined  # 1.96 x 0.94 / 40 = 4.6 % < 10 %
    assert "separately determined" in split_statement(s, True)


def test_split_not_determined_when_wide_unfavoured_or_without_a_mode():
    wide = lambda_split(80.0, 0.5, np.diag([1.0, 0.05**2]), favoured=True)  # SE of lambda_s ~ 4 (10 %)
    assert wide.lambda_s_95[1] > 40.0 * (1.0 + SPLIT_TOLERANCE) and not wide.determined
    assert "wider than +-10 %" in split_statement(wide, True)
    assert not lambda_split(80.0, 0.5, np.diag([1.0, 1e-4]), favoured=False).determined
    none = lambda_split(80.0, 0.0, np.diag([1.0, 1e-4]), favoured=True)
    assert not none.determined and none.lambda_v_95 == (None, None)
    assert "no reorganization in the quantized mode" in split_statement(none, True)
