"""Design checks: the Check type, one driver per basis (us_asd, eu_lsd) on a shared
skeleton (common).
"""
