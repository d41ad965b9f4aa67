// SPDX-License-Identifier: MIT
// The exact sign of a short sum of products of doubles, Σ aᵢ·bᵢ.
// Order statistics over pairwise slopes must decide "is this pair's slope
// below t" without rounding, or a median of 50 million slopes could land one
// slope away from the true one. Almost every such decision is settled by a
// correctly rounded key (see theil_sen.cpp); the few ties that remain come
// here, where every double is an integer times a power of two and the sum is
// added up in a fixed-point integer wide enough for any finite doubles, so
// overflow and underflow cannot occur.
#pragma once

#include <cstddef>

namespace almanac {

struct Product {
    double a;
    double b;
};

// -1, 0 or +1: the sign of Σ terms[i].a · terms[i].b, exactly. Every factor
// must be finite. Subtract a product by negating one of its factors (exact).
int exact_sign_of_sum(const Product* terms, std::size_t count);

}  // namespace almanac
