# Builds the hand-made refit of test/kinds/reaction-order/report-fixture.ts (an invented first-order dye fading,
# 2 runs) with numpy and scipy, outside our code: python3 test/kinds/reaction-order/fading-refit.py
import json, numpy as np
from scipy.optimize import least_squares
from scipy.stats import t as tdist, norm
rng = np.random.default_rng(24)
eps, l, Ainf, k = 2.4e4, 1.0, 0.020, 0.045
times = np.arange(0, 44, 4.0)
runs = []
for label, c0 in [('A', 3.0e-5), ('B', 1.5e-5)]:
    A = Ainf + eps*l*c0*np.exp(-k*times) + rng.normal(0, 0.003, times.size)
    A = np.round(A, 3)
    runs.append((label, times.copy(), A))
conc = [(A - Ainf)/(eps*l) for _, _, A in runs]
units = {0: 'M min^-1', 1: 'min^-1', 2: 'M^-1 min^-1'}
def est(v, se, dof):
    q = tdist.ppf(0.975, dof)
    return {'value': float(v), 'standardError': float(se), 'ci95': [float(v-q*se), float(v+q*se)], 'unit': None}
ys = {0: lambda c: c, 1: np.log, 2: lambda c: 1/c}
sign = {0: -1, 1: -1, 2: 1}
model = {0: lambda c0,k,t: c0-k*t, 1: lambda c0,k,t: c0*np.exp(-k*t), 2: lambda c0,k,t: c0/(1+k*c0*t)}
byOrder = []
for n in (0,1,2):
    # linear: common slope, per-run intercepts
    X = []; Y = []
    for r,(lab,t,_) in enumerate(runs):
        for i,ti in enumerate(t):
            row = [0.0]*len(runs); row[r] = 1.0; X.append(row+[sign[n]*ti]); Y.append(ys[n](conc[r][i]))
    X = np.array(X); Y = np.array(Y)
    beta, *_ = np.linalg.lstsq(X, Y, rcond=None)
    res = Y - X@beta; dof = len(Y)-X.shape[1]; s2 = res@res/dof
    cov = s2*np.linalg.inv(X.T@X)
    lin = {'k': est(beta[-1], np.sqrt(cov[-1,-1]), dof), 'intercepts': [float(b) for b in beta[:-1]], 'residualSS': float(res@res), 'dof': dof, 'readingsLeftOut': 0}
    lin['k']['unit'] = units[n]
    # nonlinear on concentrations
    def f(p):
        return np.concatenate([model[n](p[r], p[-1], runs[r][1]) - conc[r] for r in range(len(runs))])
    p0 = [conc[r][0] for r in range(len(runs))] + [abs(beta[-1])]
    sol = least_squares(f, p0, x_scale='jac', xtol=1e-15, ftol=1e-15, gtol=1e-15)
    J = sol.jac; res = sol.fun; dofn = len(res)-len(p0); s2 = res@res/dofn
    cov = s2*np.linalg.inv(J.T@J)
    resid = [list(map(float, res[r*len(times):(r+1)*len(times)])) for r in range(len(runs))]
    num = sum(np.sum(np.diff(np.array(rr))**2) for rr in resid); dw = num/(res@res)
    # normal approximation of DW under independence, one-sided for positive correlation (display only)
    N = len(res); p = float(norm.cdf((dw-2)/np.sqrt(4/N)))
    nl = {'k': est(sol.x[-1], np.sqrt(cov[-1,-1]), dofn), 'initialConcentrations': [float(c) for c in sol.x[:-1]], 'residualSS': float(res@res), 'residualSDSignal': float(np.sqrt(s2)*eps*l), 'dof': dofn, 'durbinWatson': float(dw), 'patternP': p, 'residuals': resid}
    nl['k']['unit'] = units[n]
    byOrder.append({'order': n, 'linear': lin, 'nonlinear': nl})
k1 = byOrder[1]['nonlinear']['k']
runsOut = []
for r,(lab,t,A) in enumerate(runs):
    c = conc[r]
    hl = np.log(2)/k1['value']; se = np.log(2)/k1['value']**2*k1['standardError']
    runsOut.append({'label': lab, 'times': list(map(float,t)), 'concentrations': list(map(float,c)), 'initialConcentration': float(c[0]), 'fractionReacted': float(1-c[-1]/c[0]), 'halfLife': {'value': float(hl), 'standardError': float(se), 'ci95': [float(hl-1.96*se), float(hl+1.96*se)], 'unit': 'min'}})
refit = {'order': 1, 'orderReason': 'the order-1 law alone leaves residuals without a pattern, and the smallest residual sum', 'k': k1, 'byOrder': byOrder, 'runs': runsOut, 'gradedOrder': 1, 'orderVerdict': 'supported'}
readings = [[[float(a), float(b)] for a,b in zip(t,A)] for _,t,A in runs]
print(json.dumps({'refit': refit, 'readings': readings}, indent=1))
