#include <iostream>
#include "rimline/version.hpp"
int main() { std::cout << "rimline " << rimline::version_string << "\n"; return 0; }
